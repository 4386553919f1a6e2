import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readEdf } from '../../../shared/io/edf/readEdf';
import { writeEdf } from '../../../shared/io/edf/writeEdf';
import { forecatchEdfInputs } from '../../fixtures/io/make_forecatch_edf';

const FIX = new URL('../../fixtures/io/', import.meta.url);
interface Described {
  filetype: number;
  datarecords: number;
  datarecordDurationS: number;
  signals: { label: string; units: string; rateHz: number; samples: number; physicalMin: number; physicalMax: number; lsb: number; edflibPhysical: number[] }[];
  annotations: { onsetS: number; durationS: number | null; text: string }[];
}
// What Debian's EDFlib (libedf-dev 1.23) reads from the files Forecatch wrote (test/fixtures/io/make_edflib_files.sh).
const edflib = JSON.parse(readFileSync(new URL('edflib_reads_forecatch.json', FIX), 'utf8')) as Record<string, Described>;

describe("EDFlib reads Forecatch's writeEdf output (outside check of the writer)", () => {
  const { signals, events } = forecatchEdfInputs();
  const cases = [
    ['forecatch_written.edf', writeEdf(signals, { format: 'edf+', recordDurationS: 0.5, events }), 1],
    ['forecatch_written.bdf', writeEdf(signals, { format: 'bdf+', recordDurationS: 1, events }), 3],
  ] as const;
  for (const [name, bytes, filetype] of cases) {
    it(`${name}: EDFlib opens it as ${filetype === 1 ? 'EDF+' : 'BDF+'} and reads the written values within half a step, with the annotations`, () => {
      // The committed file is what the writer still writes, so EDFlib's reading applies to today's writer.
      expect(bytes).toEqual(new Uint8Array(readFileSync(new URL(name, FIX))));
      const d = edflib[name];
      expect(d.filetype).toBe(filetype);
      signals.forEach((s, k) => {
        const e = d.signals[k];
        expect([e.label.trim(), e.units.trim(), e.rateHz, e.samples]).toEqual([s.label, s.units, s.rateHz, s.values.length]);
        for (let i = 0; i < s.values.length; i++) expect(Math.abs(e.edflibPhysical[i] - s.values[i])).toBeLessThanOrEqual(e.lsb / 2 + 1e-12);
      });
      expect(d.annotations.map((a) => [a.onsetS, a.durationS, a.text])).toEqual(events.map((e) => [e.timeS, e.durationS ?? null, e.label]));
    });

    it(`${name}: readEdf and EDFlib read the same numbers`, () => {
      const rec = readEdf(bytes, name);
      edflib[name].signals.forEach((e, k) => {
        const range = e.physicalMax - e.physicalMin;
        for (let i = 0; i < e.samples; i++) expect(Math.abs(rec.signals[k].values[i] - e.edflibPhysical[i])).toBeLessThanOrEqual(1e-12 * range);
      });
    });
  }
});
