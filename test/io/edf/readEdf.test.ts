import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../../shared/errors';
import { edfPhysicalValue, readEdf } from '../../../shared/io/edf/readEdf';
import { buildEdf } from './edfBuilder';

const FIX = new URL('../../fixtures/io/', import.meta.url);
interface ExpectedSignal { label: string; units: string; rateHz: number; samples: number; physicalMin: number; physicalMax: number; digitalMin: number; digitalMax: number; lsb: number; edflibPhysical: number[]; intended: number[]; intendedFrom: string }
interface ExpectedFile { filetype: number; datarecords: number; datarecordDurationS: number; signals: ExpectedSignal[]; annotations: { onsetS: number; durationS: number | null; text: string }[] }
const expected = JSON.parse(readFileSync(new URL('edflib_expected.json', FIX), 'utf8')) as Record<string, ExpectedFile>;

function parseError(fn: () => unknown): ParseError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(ParseError);
    return e as ParseError;
  }
  throw new Error('expected a ParseError');
}

describe('readEdf against files written and read by EDFlib (Debian libedf-dev 1.23, test/fixtures/io/make_edflib_files.c)', () => {
  for (const name of ['edflib_emg.edf', 'edflib_emg.bdf']) {
    it(`${name}: labels, units, rates, sample values and annotations equal EDFlib's`, () => {
      const exp = expected[name];
      const rec = readEdf(new Uint8Array(readFileSync(new URL(name, FIX))), name);
      expect(rec.format).toBe(exp.filetype === 1 ? 'edf+' : 'bdf+');
      expect(rec.meta.recordCount).toBe(exp.datarecords);
      expect(rec.meta.recordDurationS).toBe(exp.datarecordDurationS);
      expect(rec.signals).toHaveLength(exp.signals.length);
      exp.signals.forEach((es, i) => {
        const s = rec.signals[i];
        expect(s.label).toBe(es.label.trim());
        expect(s.units).toBe(es.units.trim());
        expect(s.rateHz).toBe(es.rateHz);
        expect(s.startS).toBe(0);
        expect(s.values.length).toBe(es.samples);
        const range = es.physicalMax - es.physicalMin;
        for (let k = 0; k < es.samples; k++) {
          // Same numbers as EDFlib's reader up to floating-point evaluation order.
          expect(Math.abs(s.values[k] - es.edflibPhysical[k])).toBeLessThanOrEqual(1e-12 * range);
          // And the values meant before quantization: within one step for the sine (EDFlib's physical-to-digital
          // conversion does not round to nearest) and exactly the scaling rule's value for the digital ramp.
          const tol = es.intendedFrom.startsWith('sine') ? es.lsb + 1e-12 * range : 1e-12 * range;
          expect(Math.abs(s.values[k] - es.intended[k])).toBeLessThanOrEqual(tol);
        }
      });
      expect(rec.events.map((e) => [e.timeS, e.durationS ?? null, e.label])).toEqual(exp.annotations.map((a) => [a.onsetS, a.durationS === null ? null : Number(a.durationS.toPrecision(12)), a.text]));
      expect(rec.warnings).toEqual([]);
    });
  }
});

describe('EDF scaling rule (Kemp et al. 1992, Electroencephalogr Clin Neurophysiol 82:391-393)', () => {
  // value = (digital - digMin) * (physMax - physMin) / (digMax - digMin) + physMin; hand-checked values
  // for a 12-bit ADC spanning -500..500 uV (digital -2048..2047): step 1000/4095 uV.
  const h = { physicalMin: -500, physicalMax: 500, digitalMin: -2048, digitalMax: 2047 };
  it('maps the digital extremes to the physical extremes', () => {
    expect(edfPhysicalValue(-2048, h)).toBe(-500);
    expect(edfPhysicalValue(2047, h)).toBe(500);
  });
  it('maps digital 0 to 2048 x 1000/4095 - 500 = 0.12210012210... uV and digital 1 one step above', () => {
    expect(edfPhysicalValue(0, h)).toBeCloseTo(0.1221001221001221, 12);
    expect(edfPhysicalValue(1, h) - edfPhysicalValue(0, h)).toBeCloseTo(0.2442002442002442, 12);
  });
  it('allows an inverted physical range (physMin > physMax), giving inverted polarity', () => {
    expect(edfPhysicalValue(-2048, { ...h, physicalMin: 500, physicalMax: -500 })).toBe(500);
  });
  it('is what readEdf applies to stored 16-bit samples, including negative ones', () => {
    const bytes = buildEdf({ records: 1, recordDuration: 1, signals: [{ label: 'emg', units: 'uV', physMin: -500, physMax: 500, digMin: -2048, digMax: 2047, spr: 4, digital: [-2048, -1, 0, 2047] }] });
    const rec = readEdf(bytes, 'kemp.edf');
    expect(rec.format).toBe('edf');
    expect(Array.from(rec.signals[0].values).map((v) => Number(v.toFixed(9)))).toEqual([-500, -0.122100122, 0.122100122, 500]);
  });
});

describe('readEdf: plain EDF/BDF structure', () => {
  it('reads signals with different samples per record as different rates (record 0.5 s)', () => {
    const bytes = buildEdf({
      records: 2,
      recordDuration: 0.5,
      signals: [
        { label: 'emg', units: 'mV', physMin: -1, physMax: 1, digMin: -32768, digMax: 32767, spr: 4, digital: [-32768, 0, 32767, 1, 2, 3, 4, 5] },
        { label: 'force', units: 'N', physMin: 0, physMax: 100, digMin: 0, digMax: 100, spr: 1, digital: [10, 20] },
      ],
    });
    const rec = readEdf(bytes, 'two.edf');
    expect(rec.signals.map((s) => [s.label, s.units, s.rateHz, s.values.length])).toEqual([
      ['emg', 'mV', 8, 8],
      ['force', 'N', 2, 2],
    ]);
    expect(Array.from(rec.signals[1].values)).toEqual([10, 20]);
    expect(rec.signals[0].values[0]).toBe(-1);
    expect(rec.signals[0].values[2]).toBe(1);
  });

  it('reads 24-bit little-endian two\'s complement BDF samples', () => {
    const bytes = buildEdf({ bdf: true, reserved: '24BIT', records: 1, recordDuration: 1, signals: [{ label: 'emg', physMin: -8388608, physMax: 8388607, digMin: -8388608, digMax: 8388607, spr: 4, digital: [-8388608, -1, 1, 8388607] }] });
    const rec = readEdf(bytes, 'x.bdf');
    expect(rec.format).toBe('bdf');
    expect(Array.from(rec.signals[0].values)).toEqual([-8388608, -1, 1, 8388607]);
  });

  it('takes the record count from the file size when the header says -1, with a warning', () => {
    const bytes = buildEdf({ records: -1, writeRecords: 3, recordDuration: 1, signals: [{ label: 'a', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 }] });
    const rec = readEdf(bytes, 'open.edf');
    expect(rec.signals[0].values.length).toBe(6);
    expect(rec.warnings.map((w) => w.code)).toEqual(['RECORD_COUNT_UNKNOWN']);
  });

  it('returns the whole records of a truncated file with a warning, and a ParseError when none is whole', () => {
    const full = buildEdf({ records: 4, recordDuration: 1, signals: [{ label: 'a', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 }] });
    const rec = readEdf(full.subarray(0, full.length - 3), 'cut.edf');
    expect(rec.signals[0].values.length).toBe(6);
    expect(rec.warnings[0].code).toBe('TRUNCATED');
    const e = parseError(() => readEdf(full.subarray(0, 512 + 2), 'cut.edf'));
    expect(e.byteOffset).toBe(514);
  });
});

describe('readEdf: header checks give ParseError at the byte offset', () => {
  const ok = () => ({ records: 1, recordDuration: 1, signals: [{ label: 'a', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 } as const] });
  it('version field', () => {
    const b = buildEdf(ok());
    b[0] = 0x31;
    expect(parseError(() => readEdf(b, 'v.edf')).byteOffset).toBe(0);
  });
  it('too short for a header', () => {
    expect(parseError(() => readEdf(new Uint8Array(100), 's.edf')).byteOffset).toBe(100);
  });
  it('non-ASCII header byte', () => {
    const b = buildEdf(ok());
    b[20] = 0xe9;
    expect(parseError(() => readEdf(b, 'a.edf')).byteOffset).toBe(20);
  });
  it('number fields that do not parse, and counts that disagree', () => {
    expect(parseError(() => readEdf(buildEdf({ ...ok(), records: 'ten' }), 'n.edf')).byteOffset).toBe(236);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), headerBytes: 1024 }), 'h.edf')).byteOffset).toBe(184);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), recordDuration: -1 }), 'd.edf')).byteOffset).toBe(244);
  });
  it('signal fields: digital range, physical range, samples per record (offsets of the field of signal 1)', () => {
    const sig = ok().signals[0];
    // ns = 1: physMax at 256+16+80+8+8 = 368, digMin 376, digMax 384, spr 472.
    expect(parseError(() => readEdf(buildEdf({ ...ok(), signals: [{ ...sig, physMax: 0 }] }), 'p.edf')).byteOffset).toBe(368);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), signals: [{ ...sig, digMin: 40000 }] }), 'p.edf')).byteOffset).toBe(376);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), signals: [{ ...sig, digMax: 0 }] }), 'p.edf')).byteOffset).toBe(384);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), signals: [{ ...sig, spr: 'x' }] }), 'p.edf')).byteOffset).toBe(472);
    expect(parseError(() => readEdf(buildEdf({ ...ok(), signals: [{ ...sig, spr: 0 }] }), 'p.edf')).byteOffset).toBe(472);
  });
  it('a signal count larger than the file can hold is refused before any allocation', () => {
    const b = buildEdf(ok());
    b.set([0x39, 0x39, 0x39, 0x39], 252);
    expect(parseError(() => readEdf(b, 'ns.edf')).byteOffset).toBe(252);
  });
});

describe('readEdf: EDF+ annotations and time-keeping (Kemp & Olivan 2003, Clin Neurophysiol 114:1755-1761)', () => {
  const annot = (texts: string[]) => ({ label: 'EDF Annotations', physMin: -1, physMax: 1, digMin: -32768, digMax: 32767, spr: 30, annotationText: texts });
  it('parses TALs with and without duration and several texts per TAL (the standard\'s examples, from memory)', () => {
    const bytes = buildEdf({
      reserved: 'EDF+C',
      records: 1,
      recordDuration: 1,
      signals: [{ label: 'a', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 1 }, { ...annot(['+0\x14\x14\x00+180\x14Lights off\x14Close door\x14\x00+1800.2\x1525.5\x14Apnea\x14\x00']), spr: 40 }],
    });
    const rec = readEdf(bytes, 'tal.edf');
    expect(rec.events.map((e) => [e.timeS, e.label, e.durationS])).toEqual([
      [180, 'Lights off', undefined],
      [180, 'Close door', undefined],
      [1800.2, 'Apnea', 25.5],
    ]);
  });

  it('flags EDF+D records with gaps: explicit sample times and per-record starts', () => {
    const bytes = buildEdf({
      reserved: 'EDF+D',
      records: 3,
      recordDuration: 0.5,
      signals: [
        { label: 'emg', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 },
        annot(['+0\x14\x14\x00', '+0.5\x14\x14\x00', '+10\x14\x14\x00+10.25\x14stop\x14\x00']),
      ],
    });
    const rec = readEdf(bytes, 'gap.edf');
    expect(rec.format).toBe('edf+');
    expect(rec.meta.variant).toBe('EDF+D');
    expect(Array.from(rec.signals[0].timesS!)).toEqual([0, 0.25, 0.5, 0.75, 10, 10.25]);
    expect(rec.meta.recordStartsS).toEqual([0, 0.5, 10]);
    expect(rec.warnings.map((w) => w.code)).toContain('DISCONTINUOUS');
    expect(rec.events).toEqual([{ timeS: 10.25, label: 'stop', context: 'EDF Annotations' }]);
  });

  it('uses the first time-keeping TAL as the start of every signal', () => {
    const bytes = buildEdf({
      reserved: 'EDF+C',
      records: 2,
      recordDuration: 1,
      signals: [{ label: 'emg', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 }, annot(['+0.125\x14\x14\x00', '+1.125\x14\x14\x00'])],
    });
    const rec = readEdf(bytes, 'sub.edf');
    expect(rec.signals[0].startS).toBe(0.125);
    expect(rec.signals[0].timesS).toBeUndefined();
  });

  it('warns about a malformed TAL and keeps the signals', () => {
    const bytes = buildEdf({
      reserved: 'EDF+C',
      records: 1,
      recordDuration: 1,
      signals: [{ label: 'emg', physMin: 0, physMax: 1, digMin: 0, digMax: 1, spr: 2 }, annot(['+0\x14\x14\x00ab\x14x\x14\x00'])],
    });
    const rec = readEdf(bytes, 'bad.edf');
    expect(rec.signals[0].values.length).toBe(2);
    expect(rec.warnings.map((w) => w.code)).toContain('BAD_ANNOTATION');
  });
});
