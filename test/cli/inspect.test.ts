import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const C3D_SAMPLE = '../shared/reference/c3d-org-samples/sample01/Eb015pi.c3d';

function forecatch(...args: string[]) {
  const r = spawnSync(process.execPath, ['bin/forecatch.mjs', ...args], { cwd: ROOT, encoding: 'utf8', timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe('forecatch inspect', () => {
  it.skipIf(!existsSync(join(ROOT, C3D_SAMPLE)))(
    'prints the c3d.org sample01 Intel integer file as one JSON object with the header facts of the reference README (skipped when ../shared/reference is absent)',
    () => {
      const r = forecatch('inspect', C3D_SAMPLE, '--json');
      expect(r.status).toBe(0);
      const j = JSON.parse(r.stdout);
      // ../shared/reference/README.md: sample01 has 26 points, 16 analog channels, frames 1 to 450, 50 Hz, 200 Hz.
      expect(j).toMatchObject({ format: 'c3d', processorType: 'intel', variant: 'integer', pointRateHz: 50, analogRateHz: 200, frames: 450, firstFrame: 1, lastFrame: 450 });
      expect(j.markers).toHaveLength(26);
      expect(j.analogChannels).toHaveLength(16);
      expect(Array.isArray(j.events)).toBe(true);
      expect(Object.keys(j.missingSamplesByMarker)).toEqual(j.markers);
    },
  );

  it('prints an EDF+ file written by EDFlib: channels with units and rates, annotations as events', () => {
    const r = forecatch('inspect', 'test/fixtures/io/edflib_emg.edf', '--json');
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j).toMatchObject({ format: 'edf+', variant: 'EDF+C', processorType: null, pointRateHz: null, markers: [], analogChannels: ['EMG biceps', 'ramp'] });
    expect(j.channels.map((c: { units: string; rateHz: number }) => [c.units, c.rateHz])).toEqual([['uV', 200], ['mV', 50]]);
    expect(j.events.map((e: { label: string }) => e.label)).toEqual(['ball release', 'contact', 'Ballkontakt ü']);
  });

  it('prints a CSV file in the default layout, with missing samples per marker, as text and as JSON', () => {
    const text = forecatch('inspect', 'test/fixtures/io/rail_trial.csv');
    expect(text.status).toBe(0);
    expect(text.stdout).toMatch(/markers\s+2 at 120 Hz, frames 1-60 \(60\)/);
    expect(text.stdout).toMatch(/hand\s+missing 3/);
    const j = JSON.parse(forecatch('inspect', 'test/fixtures/io/rail_trial.csv', '--json').stdout);
    expect(j).toMatchObject({ format: 'delimited', frames: 60, firstFrame: 1, lastFrame: 60, pointRateHz: 120, markers: ['ball', 'hand'], missingSamplesByMarker: { ball: 0, hand: 3 }, analogChannels: [] });
  });

  it('applies an import template given with --template', () => {
    const dir = mkdtempSync(join(tmpdir(), 'forecatch-inspect-'));
    try {
      writeFileSync(join(dir, 'a.csv'), 'T,E\n0,1\n0.5,2\n');
      writeFileSync(join(dir, 't.json'), JSON.stringify({ version: 1, time: { column: 'T', units: 's' }, channels: [{ label: 'emg', column: 'E', units: 'mV' }] }));
      const j = JSON.parse(forecatch('inspect', join(dir, 'a.csv'), '--json', '--template', join(dir, 't.json')).stdout);
      expect(j.channels).toEqual([{ label: 'emg', units: 'mV', rateHz: 2, samples: 2, startS: 0, explicitTimes: false }]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('exits non-zero with one line on stderr for a corrupt file, a missing file, and a bad CSV', () => {
    const dir = mkdtempSync(join(tmpdir(), 'forecatch-inspect-'));
    try {
      const corrupt = join(dir, 'corrupt.edf');
      writeFileSync(corrupt, Buffer.from('0       ' + 'x'.repeat(300)));
      const bad = join(dir, 'bad.csv');
      writeFileSync(bad, 'time,emg\n0,1\n0.1,oops\n');
      for (const [path, pattern] of [
        [corrupt, /corrupt\.edf: byte 184: expected a number/],
        [join(dir, 'absent.c3d'), /absent\.c3d: cannot read: no such file/],
        [bad, /bad\.csv: line 3, column emg: expected a number/],
      ] as const) {
        const r = forecatch('inspect', path);
        expect(r.status).not.toBe(0);
        expect(r.stdout).toBe('');
        expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
        expect(r.stderr).toMatch(pattern);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
