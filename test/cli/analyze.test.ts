import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { command as analyze } from '../../cli/commands/analyze';
import { writeSimulatedStudy } from '../../cli/io/writeSimulatedStudy';
import { atomicWriteFile } from '../../cli/io/atomicWrite';
import { simulateStudy } from '../../shared/simulate/simulateStudy';
import { writeC3d } from '../../shared/io/c3d/writeC3d';
import { parseStudyFile } from '../../shared/study/parseStudyFile';
import { serializeStudy } from '../../shared/study/studyFile';

const G0 = 9.80665;

async function runCli(args: string[]): Promise<{ code: number; stderr: string; stdout: string }> {
  let stderr = '';
  let stdout = '';
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s: string | Uint8Array) => ((stderr += String(s)), true));
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s: string | Uint8Array) => ((stdout += String(s)), true));
  try {
    const code = await analyze.run(args);
    return { code, stderr, stdout };
  } finally {
    e.mockRestore();
    o.mockRestore();
  }
}

describe('forecatch analyze on a trial list with problems (issue 5 "Checks")', () => {
  let dir = '';
  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'forecatch-analyze-'));
    const sim = simulateStudy({
      subjects: [{ id: 'sim', internalGMps2: G0, ttcThresholdS: 0.2, delayS: 0.1, motorNoiseSdS: 0.01 }],
      trialsPerSubject: 7,
      seed: 11,
      silentTrials: ['sim-t002'],
    });
    const studyPath = await writeSimulatedStudy(dir, sim.trials, sim.settings, 'problems', 'invented data\n');
    // a trial whose ball never reaches the hand: the hand marker sits 0.5 m below the catch height
    const low = sim.trials[3];
    const rec = structuredClone({ ...low.recording, signals: [] });
    const hand = rec.markers!.markers.find((m) => m.label === 'hand')!;
    hand.z.fill(0.5);
    await writeFile(join(dir, 'sim/low-hand.c3d'), writeC3d(rec));
    await writeFile(join(dir, 'sim/corrupt.c3d'), Uint8Array.from({ length: 3000 }, (_, i) => (i * 37) % 256));
    const study = parseStudyFile(await readFile(studyPath, 'utf8'), 'study.forecatch.json');
    const t4 = study.trials[3];
    study.trials.push(
      { ...t4, id: 'missing', file: 'sim/does-not-exist.c3d' },
      { ...t4, id: 'corrupt', file: 'sim/corrupt.c3d' },
      { ...t4, id: 'never-reaches', file: 'sim/low-hand.c3d' },
    );
    await writeFile(studyPath, serializeStudy(study));
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  it('completes for the good trials, reports each problem with its file and reason, and exits 0', async () => {
    const out = join(dir, 'results');
    const r = await runCli([dir, '--out', out]);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/trial missing \(sim\/does-not-exist\.c3d\): .*no such file/);
    expect(r.stderr).toMatch(/trial corrupt \(sim\/corrupt\.c3d\): /);
    expect(r.stderr).toMatch(/trial sim-t002 \(sim\/sim-t002\.c3d\): no-onset/);
    expect(r.stderr).toMatch(/trial never-reaches \(sim\/low-hand\.c3d\): no-contact/);
    const csv = (await readFile(join(out, 'trials.csv'), 'utf8')).trim().split('\n');
    const header = csv[1].split(',');
    const rows = csv.slice(2).map((l) => Object.fromEntries(l.split(',').map((v, i) => [header[i], v])));
    const usableTrials = new Set(rows.filter((x) => x.usable === 'true').map((x) => x.trial));
    expect(usableTrials.size).toBeGreaterThanOrEqual(5);
    for (const bad of ['missing', 'corrupt', 'never-reaches', 'sim-t002']) expect(usableTrials.has(bad)).toBe(false);
    expect(rows.find((x) => x.trial === 'never-reaches')?.contact_s).toBe('');
    const methods = await readFile(join(out, 'methods.txt'), 'utf8');
    expect(methods).toMatch(/2 could not be read/);
    const models = await readFile(join(out, 'models.csv'), 'utf8');
    expect(models.split('\n')[0]).toBe(csv[0]);
  });

  it('exits non-zero only when nothing could be analysed', async () => {
    const csvPath = join(dir, 'only-missing.csv');
    await writeFile(csvPath, 'trial,subject,condition,file\nt1,s1,c,nope.c3d\n');
    const r = await runCli([csvPath, '--out', join(dir, 'r2'), '--emg', 'FCR']);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/no trial could be analysed/);
  });

  it('takes settings from flags (hypotheses, delay) and rejects bad ones', async () => {
    const out = join(dir, 'r3');
    const r = await runCli([join(dir, 'trials.csv'), '--out', out, '--emg', 'FCR', '--hypotheses', 'gravity,g=4.9', '--delay-ms', '50', '--json']);
    expect(r.code).toBe(0);
    const summary = JSON.parse(r.stdout);
    expect(summary.prepared).toBe(7);
    const csv = await readFile(join(out, 'trials.csv'), 'utf8');
    expect(new Set(csv.split('\n').slice(2, -1).map((l) => l.split(',')[4]))).toEqual(new Set(['gravity', 'g=4.9']));
    expect(await readFile(join(out, 'methods.txt'), 'utf8')).toMatch(/visuomotor delay of 50 ms/);
    await expect(analyze.run([dir, '--out', out, '--hypotheses', 'nonsense'])).rejects.toThrow(/unknown hypothesis 'nonsense'/);
  });
});

describe('atomicWriteFile', () => {
  it('replaces the file, keeps the previous version as .bak and leaves no temporary file', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'forecatch-atomic-'));
    const p = join(dir, 'study.json');
    await atomicWriteFile(p, 'one');
    await atomicWriteFile(p, 'two');
    expect(await readFile(p, 'utf8')).toBe('two');
    expect(await readFile(`${p}.bak`, 'utf8')).toBe('one');
    expect((await readdir(dir)).sort()).toEqual(['study.json', 'study.json.bak']);
    await expect(atomicWriteFile(join(dir, 'no/such/dir/x'), 'x')).rejects.toThrow(/cannot write: no such folder/);
    await rm(dir, { recursive: true, force: true });
  });
});
