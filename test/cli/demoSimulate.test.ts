import { describe, expect, it, vi } from 'vitest';
import { mkdtemp, readFile, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { command as simulate } from '../../cli/commands/simulate';
import { command as analyze } from '../../cli/commands/analyze';
import { trialListCsv } from '../../cli/io/writeSimulatedStudy';
import { demoStudy } from '../../shared/simulate/demoStudy';
import { readRecording } from '../../shared/io/readRecording';

const assets = fileURLToPath(new URL('../../assets/demo/', import.meta.url));

async function quiet<T>(fn: () => Promise<T>): Promise<{ value: T; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => ((err += String(s)), true));
  try {
    return { value: await fn(), out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

describe('the shipped demo study (assets/demo)', () => {
  it('is what the simulator generates today (trial list, the marker data of a C3D file) and says it is invented', async () => {
    const { trials } = demoStudy();
    const specs = trials.map((t) => ({ ...t.spec, emgFile: t.spec.file.replace(/\.c3d$/, '_emg.edf'), emgOffsetS: 0 }));
    expect(await readFile(join(assets, 'trials.csv'), 'utf8')).toBe(trialListCsv(specs));
    const rec = readRecording(trials[0].spec.file, new Uint8Array(await readFile(join(assets, trials[0].spec.file))));
    const ball = rec.markers!.markers.find((m) => m.label === 'ball')!;
    const sim = trials[0].recording.markers!.markers[0].z;
    expect(ball.z.length).toBe(sim.length);
    for (let i = 0; i < sim.length; i++) {
      if (Number.isNaN(sim[i])) expect(ball.z[i]).toBeNaN();
      else expect(ball.z[i]).toBeCloseTo(sim[i], 6); // float32 millimetres
    }
    expect(await readFile(join(assets, 'README.txt'), 'utf8')).toMatch(/INVENTED DATA/);
  });
});

describe('forecatch simulate', () => {
  it('writes a study of real files (C3D, EDF+, trial list, study file, README) that analyze reads', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'forecatch-sim-'));
    try {
      const r = await quiet(() => simulate.run(['--internal-g', '1g', '--trials', '6', '--seed', '2', '--out', dir]));
      expect(r.value).toBe(0);
      expect((await readdir(dir)).sort()).toEqual(['README.txt', 'sim', 'study.forecatch.json', 'trials.csv']);
      expect((await readdir(join(dir, 'sim'))).filter((f) => f.endsWith('.edf'))).toHaveLength(6);
      const a = await quiet(() => analyze.run([dir, '--out', join(dir, 'out'), '--bootstrap', '0']));
      expect(a.value).toBe(0);
      expect(a.out).toMatch(/analysed 6 of 6 trials/);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });
  it('refuses a bad internal gravity', async () => {
    await expect(simulate.run(['--internal-g', '-1', '--out', 'x'])).rejects.toThrow(/--internal-g must be >= 0/);
  });
});
