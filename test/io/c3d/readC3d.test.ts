/**
 * readC3d on files assembled byte by byte (buildC3dBytes): every processor type and storage form, header
 * pointers, parameter-section details, analog scaling, frames beyond 65535, events and bad input.
 * Layout facts: C3D file format user guide, c3d.org (header words, parameter records, data types).
 */
import { describe, expect, it } from 'vitest';
import { ParseError } from '../../../shared/errors';
import { readC3d, c3dToRecording, getC3dParameter, vaxFloatToNumber, numberToVaxFloat } from '../../../shared/io/c3d';
import { buildC3dBytes, type FixtureProcessor, type FixtureRecord, type FixtureSpec } from './buildC3dBytes';
import { smallSpec, SCALE } from './smallC3dSpec';
import { flatPoints } from './flatPoints';

describe('VAX F-floating conversion (DEC processor type)', () => {
  it('decodes values fixed by the format definition: value = (-1)^s x 0.1f x 2^(e - 128)', () => {
    // 1.0 = 0.5 x 2^1 -> e = 129, f = 0 -> first word 0x4080; 0.5 -> e = 128 -> 0x4000; sign bit 0x8000.
    expect(vaxFloatToNumber(0x4080, 0)).toBe(1);
    expect(vaxFloatToNumber(0xc080, 0)).toBe(-1);
    expect(vaxFloatToNumber(0x4000, 0)).toBe(0.5);
    expect(vaxFloatToNumber(0x40c0, 0)).toBe(1.5);
    expect(vaxFloatToNumber(0x0000, 0)).toBe(0);
    expect(vaxFloatToNumber(0x0000, 0x1234)).toBe(0); // exponent 0, sign clear: zero whatever the fraction
    expect(vaxFloatToNumber(0x8000, 0)).toBeNaN(); // reserved operand
    // Largest exponent is finite on the VAX: (2 - 2^-23) x 2^126.
    expect(vaxFloatToNumber(0x7fff, 0xffff)).toBe((2 - 2 ** -23) * 2 ** 126);
  });

  it('reads the header scale of the c3d.org sample02 DEC file as the Intel file stores it (0x3e8ff712 IEEE)', () => {
    // dec_int.c3d header words 7-8 are 8f 3f 12 f7 (bytes); pc_int.c3d stores 12 f7 8f 3e.
    const ieee = new DataView(new Uint8Array([0x12, 0xf7, 0x8f, 0x3e]).buffer).getFloat32(0, true);
    expect(vaxFloatToNumber(0x3f8f, 0xf712)).toBe(ieee);
  });

  it('encodes and decodes back every float32 in its range', () => {
    for (const v of [1, -2.5, 0.28118187189102173, 1e-30, -6.5e20, 123456.78125]) {
      const f = Math.fround(v);
      const [hi, lo] = numberToVaxFloat(f);
      expect(vaxFloatToNumber(hi, lo)).toBe(f);
    }
  });
});

describe('readC3d: processor types and storage forms', () => {
  const variants: [FixtureProcessor, boolean][] = [
    ['intel', false],
    ['intel', true],
    ['dec', false],
    ['dec', true],
    ['sgi', false],
    ['sgi', true],
  ];
  for (const [processor, float] of variants) {
    it(`${processor} ${float ? 'float' : 'integer'}: points scaled, invalid samples NaN, residual and camera mask kept, analog scaled`, () => {
      const c3d = readC3d(buildC3dBytes(smallSpec(processor, float)), `${processor}.c3d`);
      expect(c3d.warnings).toEqual([]);
      expect(c3d.processor).toBe(processor);
      expect(c3d.storage).toBe(float ? 'float' : 'integer');
      expect(c3d.firstFrame).toBe(5);
      expect(c3d.frameCount).toBe(3);
      // Labels trimmed; locked names read like the others.
      expect(c3d.points.labels).toEqual(['BALL', 'HAND']);
      expect(c3d.groups.get('POINT')!.locked).toBe(true);
      expect(getC3dParameter(c3d.groups, 'POINT', 'USED')!.locked).toBe(true);
      expect(getC3dParameter(c3d.groups, 'POINT', 'LABELS')!.description).toBe('marker names');
      const F = 3;
      const pts = flatPoints(c3d);
      const at = (p: number, a: number, f: number): number => pts.xyz[(p * 3 + a) * F + f];
      // x = raw x POINT:SCALE in integer files; float files store the product.
      expect([at(0, 0, 0), at(0, 1, 0), at(0, 2, 0), at(0, 0, 2)]).toEqual([5, 10, -15, 6]);
      expect([at(1, 0, 0), at(1, 1, 2), at(1, 2, 2)]).toEqual([20, 25, 30]);
      expect([at(1, 0, 1), at(1, 1, 1), at(1, 2, 1)]).toEqual([NaN, NaN, NaN]);
      // Residual word (5 << 8) | 3: camera mask 5, residual 3 x |scale|.
      expect(pts.cameraMask[0]).toBe(5);
      expect(pts.residual[0]).toBe(3 * SCALE);
      expect(pts.residual[F + 1]).toBeNaN();
      expect(pts.cameraMask[F + 1]).toBe(0);
      expect(pts.residual[F + 0]).toBe(0);
      // (raw - OFFSET) x SCALE x GEN_SCALE, samples of frame f at f * 2 + s.
      const [a, b] = c3d.analog.channels;
      expect([a.label, a.units, b.label, b.units]).toEqual(['EMG1', 'mV', 'FORCE', 'N']);
      expect(Array.from(a.values)).toEqual([0, 0.5, 0.5, 1, 1, 1.5]);
      expect(Array.from(b.values, (v) => v + 0)).toEqual([0, -4, 0, -4, 0, -4]);
      expect(c3d.analog.rateHz).toBe(200);
      expect(c3d.analog.samplesPerFrame).toBe(2);
    });
  }

  it('reads the same values from a view at an unaligned byte offset (no zero-copy fast path)', () => {
    for (const processor of ['intel', 'sgi'] as const) {
      const bytes = buildC3dBytes(smallSpec(processor, true));
      const host = new Uint8Array(bytes.length + 3);
      host.set(bytes, 1);
      const aligned = readC3d(bytes, 'a.c3d');
      const shifted = readC3d(host.subarray(1, 1 + bytes.length), 'b.c3d');
      expect(Array.from(flatPoints(shifted).xyz)).toEqual(Array.from(flatPoints(aligned).xyz));
      expect(Array.from(shifted.analog.channels[1].values)).toEqual(Array.from(aligned.analog.channels[1].values));
    }
  });

  it('honours header pointers: parameter section in block 3, data several blocks after it', () => {
    const spec = smallSpec('intel', false, { parameterBlock: 3, gapBlocks: 3 });
    const bytes = buildC3dBytes(spec);
    expect(bytes[0]).toBe(3);
    const c3d = readC3d(bytes, 'moved.c3d');
    expect(c3d.header.dataStartBlock).toBe(7);
    expect(c3d.points.labels).toEqual(['BALL', 'HAND']);
    expect(c3d.points.trajectories[0].x[0]).toBe(5);
    expect(Array.from(c3d.analog.channels[0].values)).toEqual([0, 0.5, 0.5, 1, 1, 1.5]);
  });

  it('takes the data start from POINT:DATA_START when the header copy disagrees, with a warning', () => {
    // Parameters in block 2, one gap block, data in block 4; the header says block 3 (the gap).
    const base = smallSpec('intel', false, { gapBlocks: 1, headerDataStartBlock: 3 });
    const bad = buildC3dBytes({
      ...base,
      records: [...base.records, { kind: 'param', group: 1, name: 'DATA_START', type: 2, dims: [], values: [4] }],
    });
    const c3d = readC3d(bad, 'start.c3d');
    expect(c3d.warnings.map((w) => w.code)).toEqual(['C3D_DATA_START']);
    expect(c3d.points.trajectories[0].x[0]).toBe(5);
  });

  it('reads ANALOG:FORMAT UNSIGNED integer words as 0..65535 (offset too)', () => {
    const spec = smallSpec('intel', false, {}, [{ kind: 'param', group: 2, name: 'FORMAT', type: -1, dims: [8], values: ['UNSIGNED'] }]);
    const off = spec.records.find((r) => r.kind === 'param' && r.group === 2 && r.name === 'OFFSET')!;
    (off as { values: number[] }).values = [40000, 2000];
    spec.frames = spec.frames.map((fr) => [...fr.slice(0, 8), 40100, 2000, 50000, 2000]);
    spec.unsignedFromWord = 8;
    const c3d = readC3d(buildC3dBytes(spec), 'unsigned.c3d');
    expect(c3d.analog.unsigned).toBe(true);
    // (40100 - 40000) x 0.25 x 2 = 50; (50000 - 40000) x 0.5 = 5000. Signed reading would give negative raws.
    expect(Array.from(c3d.analog.channels[0].values.subarray(0, 2))).toEqual([50, 5000]);
  });

  it('keeps multi-dimensional arrays in column order (first dimension fastest) and all data types', () => {
    const corners = Array.from({ length: 24 }, (_, i) => i);
    const spec = smallSpec('sgi', false, {}, [
      { kind: 'group', id: 3, name: 'FORCE_PLATFORM', description: 'plates' },
      { kind: 'param', group: 3, name: 'CORNERS', type: 4, dims: [3, 4, 2], values: corners },
      { kind: 'param', group: 3, name: 'ZERO', type: 1, dims: [2], values: [1, 200] },
      { kind: 'param', group: 3, name: 'NAMES', type: -1, dims: [3, 2, 2], values: ['ab', 'cd', 'ef', 'gh'] },
    ]);
    const c3d = readC3d(buildC3dBytes(spec), 'dims.c3d');
    const p = getC3dParameter(c3d.groups, 'FORCE_PLATFORM', 'CORNERS')!;
    expect(p.dims).toEqual([3, 4, 2]);
    // Element (i, j, k) sits at i + 3 * (j + 4 * k).
    expect(p.values[1 + 3 * (2 + 4 * 1)]).toBe(corners[1 + 3 * (2 + 4 * 1)]);
    expect(Array.from(p.values)).toEqual(corners);
    expect(Array.from(getC3dParameter(c3d.groups, 'FORCE_PLATFORM', 'ZERO')!.values)).toEqual([1, 200]);
    expect(getC3dParameter(c3d.groups, 'FORCE_PLATFORM', 'NAMES')!.strings).toEqual(['ab', 'cd', 'ef', 'gh']);
  });

  it('is not derailed by an empty group whose next-record offset lies (recovers with a warning)', () => {
    for (const nextOffset of [7, 0, 40000, 1]) {
      const base = smallSpec('intel', false);
      const records: FixtureRecord[] = [
        base.records[0],
        { kind: 'group', id: 9, name: 'EMPTY', description: '', nextOffset },
        ...base.records.slice(1),
      ];
      const c3d = readC3d(buildC3dBytes({ ...base, records }), 'empty-group.c3d');
      expect(c3d.warnings.map((w) => w.code), `offset ${nextOffset}`).toEqual(['C3D_PARAMETER_OFFSET']);
      expect(c3d.groups.has('EMPTY')).toBe(true);
      expect(c3d.points.labels).toEqual(['BALL', 'HAND']);
      expect(c3d.analog.channels.map((c) => c.label)).toEqual(['EMG1', 'FORCE']);
    }
  });

  it('reads header events and the EVENT group; the Recording uses the EVENT group on the frame-1 clock', () => {
    const spec = smallSpec('dec', true, {}, [
      { kind: 'group', id: 4, name: 'EVENT', description: 'events' },
      { kind: 'param', group: 4, name: 'USED', type: 2, dims: [], values: [2] },
      { kind: 'param', group: 4, name: 'TIMES', type: 4, dims: [2, 2], values: [0, 1.5, 2, 3.25] },
      { kind: 'param', group: 4, name: 'LABELS', type: -1, dims: [7, 2], values: ['Release', 'Contact'] },
      { kind: 'param', group: 4, name: 'CONTEXTS', type: -1, dims: [5, 2], values: ['Right', 'Left'] },
      { kind: 'param', group: 4, name: 'DESCRIPTIONS', type: -1, dims: [4, 2], values: ['drop', 'hit'] },
    ]);
    spec.header.events = [
      { timeS: 0.04, label: 'RIC', flag: 1 },
      { timeS: 0.06, label: 'RHS', flag: 0 },
    ];
    const c3d = readC3d(buildC3dBytes(spec), 'events.c3d');
    expect(c3d.header.hasEventLabels4).toBe(true);
    expect(c3d.header.events.map((e) => [e.label, e.displayFlag])).toEqual([
      ['RIC', 1],
      ['RHS', 0],
    ]);
    expect(c3d.header.events[0].timeS).toBeCloseTo(0.04, 7);
    // EVENT:TIMES holds [minutes, seconds] pairs.
    expect(c3d.events).toEqual([
      { timeS: 1.5, label: 'Release', context: 'Right', description: 'drop' },
      { timeS: 123.25, label: 'Contact', context: 'Left', description: 'hit' },
    ]);
    const rec = c3dToRecording(c3d);
    expect(rec.events).toEqual([
      { timeS: 1.5, label: 'Release', context: 'Right' },
      { timeS: 123.25, label: 'Contact', context: 'Left' },
    ]);
    // Frame 5 at 100 Hz is at (5 - 1) / 100 s.
    expect(rec.markers!.startS).toBeCloseTo(0.04, 15);
    expect(rec.signals[0].startS).toBe(rec.markers!.startS);
  });

  it('converts POINT:UNITS mm, cm and m to metres and warns on an unknown unit', () => {
    for (const [units, factor] of [
      ['mm', 0.001],
      ['cm', 0.01],
      ['m', 1],
      ['M ', 1],
    ] as const) {
      const spec = smallSpec('intel', true);
      const u = spec.records.find((r) => r.kind === 'param' && r.group === 1 && r.name === 'UNITS') as { values: string[]; dims: number[] };
      u.values = [units];
      u.dims = [units.length];
      const rec = c3dToRecording(readC3d(buildC3dBytes(spec), 'units.c3d'));
      expect(rec.markers!.markers[0].x[0]).toBeCloseTo(5 * factor, 12);
      expect(rec.warnings).toEqual([]);
    }
    const spec = smallSpec('intel', true);
    const u = spec.records.find((r) => r.kind === 'param' && r.group === 1 && r.name === 'UNITS') as { values: string[] };
    u.values = ['in'];
    const rec = c3dToRecording(readC3d(buildC3dBytes(spec), 'inches.c3d'));
    expect(rec.warnings.map((w) => w.code)).toEqual(['C3D_POINT_UNITS']);
  });
});

describe('readC3d: more than 65535 frames', () => {
  /** One analog channel (1 sample per frame), no points: 2 bytes per frame keeps the file small. */
  function longSpec(frames: number, records: FixtureRecord[], lastFrameHeader = 65535): FixtureSpec {
    return {
      processor: 'intel',
      float: false,
      header: { points: 0, analogPerFrame: 1, firstFrame: 1, lastFrame: lastFrameHeader, scale: 1, samplesPerFrame: 1, rateHz: 1000 },
      records: [
        { kind: 'group', id: 1, name: 'POINT' },
        { kind: 'param', group: 1, name: 'USED', type: 2, dims: [], values: [0] },
        { kind: 'param', group: 1, name: 'FRAMES', type: 2, dims: [], values: [65535] },
        { kind: 'param', group: 1, name: 'RATE', type: 4, dims: [], values: [1000] },
        { kind: 'group', id: 2, name: 'ANALOG' },
        { kind: 'param', group: 2, name: 'USED', type: 2, dims: [], values: [1] },
        { kind: 'param', group: 2, name: 'SCALE', type: 4, dims: [1], values: [1] },
        { kind: 'param', group: 2, name: 'OFFSET', type: 2, dims: [1], values: [0] },
        ...records,
      ],
      frames: Array.from({ length: frames }, (_, i) => [i % 30000]),
    };
  }

  it('takes the count from TRIAL:ACTUAL_START_FIELD / ACTUAL_END_FIELD (two 16-bit words, low first)', () => {
    // Frames 3 .. 70002: start (3, 0), end (70002 - 65536 = 4466, 1).
    const spec = longSpec(70000, [
      { kind: 'group', id: 3, name: 'TRIAL' },
      { kind: 'param', group: 3, name: 'ACTUAL_START_FIELD', type: 2, dims: [2], values: [3, 0] },
      { kind: 'param', group: 3, name: 'ACTUAL_END_FIELD', type: 2, dims: [2], values: [4466, 1] },
    ]);
    const c3d = readC3d(buildC3dBytes(spec), 'trial.c3d');
    expect(c3d.warnings).toEqual([]);
    expect([c3d.firstFrame, c3d.frameCount]).toEqual([3, 70000]);
    expect(c3d.analog.channels[0].values[69999]).toBe(69999 % 30000);
  });

  it('takes the count from POINT:LONG_FRAMES (float) when the TRIAL fields are absent', () => {
    const spec = longSpec(70000, [{ kind: 'param', group: 1, name: 'LONG_FRAMES', type: 4, dims: [], values: [70000] }]);
    const c3d = readC3d(buildC3dBytes(spec), 'long.c3d');
    expect(c3d.frameCount).toBe(70000);
  });

  it('bounds a declared count by the file size: a partial result with a warning', () => {
    const spec = longSpec(69000, [{ kind: 'param', group: 1, name: 'LONG_FRAMES', type: 4, dims: [], values: [1e9] }]);
    const bytes = buildC3dBytes(spec);
    const c3d = readC3d(bytes, 'short.c3d');
    // The last block is zero-padded to 512 bytes, so a few padding words read as frames.
    const available = Math.floor((bytes.length - (c3d.header.dataStartBlock - 1) * 512) / 2);
    expect(c3d.frameCount).toBe(available);
    expect(available).toBeGreaterThanOrEqual(69000);
    expect(c3d.warnings.map((w) => w.code)).toEqual(['C3D_TRUNCATED']);
  });
});

describe('readC3d: bad input', () => {
  const good = buildC3dBytes(smallSpec('intel', false));

  function parseError(bytes: Uint8Array): ParseError {
    try {
      readC3d(bytes, 'bad.c3d');
    } catch (e) {
      expect(e).toBeInstanceOf(ParseError);
      return e as ParseError;
    }
    throw new Error('expected a ParseError');
  }

  it('rejects a file shorter than the header, naming the byte offset', () => {
    const e = parseError(good.slice(0, 100));
    expect([e.file, e.byteOffset]).toEqual(['bad.c3d', 100]);
    expect(e.message).toMatch(/bad\.c3d: byte 100: expected a 512-byte C3D header/);
  });

  it('rejects a wrong key byte (byte 1 must be 0x50) and an unknown processor type', () => {
    const a = good.slice();
    a[1] = 0x51;
    expect(parseError(a).byteOffset).toBe(1);
    const b = good.slice();
    b[512 + 3] = 83;
    expect(parseError(b).byteOffset).toBe(512 + 3);
    expect(parseError(b).message).toMatch(/84 \(Intel\), 85 \(DEC\) or 86 \(SGI\/MIPS\)/);
  });

  it('rejects a parameter pointer or data start outside the file', () => {
    const a = good.slice();
    a[0] = 200;
    expect(parseError(a).byteOffset).toBe(0);
    const b = good.slice();
    new DataView(b.buffer).setUint16(16, 9000, true);
    expect(parseError(b).byteOffset).toBe(16);
  });

  it('warns when ANALOG:SCALE or ANALOG:OFFSET has fewer values than channels (scale 1, offset 0 assumed)', () => {
    const spec = smallSpec('intel', false);
    spec.records = spec.records.filter((r) => !(r.kind === 'param' && r.group === 2 && r.name === 'OFFSET'));
    const c3d = readC3d(buildC3dBytes(spec), 'nooffset.c3d');
    expect(c3d.warnings.map((w) => w.code)).toEqual(['C3D_ANALOG_SCALING']);
    // Raw 100 of channel A, frame 0: 100 x 0.25 x 2.
    expect(c3d.analog.channels[0].values[0]).toBe(50);
  });

  it('numbers frames from 1 with a warning when header word 4 says frame 0', () => {
    const spec = smallSpec('intel', false);
    spec.header.firstFrame = 0;
    spec.header.lastFrame = 2;
    const c3d = readC3d(buildC3dBytes(spec), 'zero.c3d');
    expect([c3d.firstFrame, c3d.frameCount]).toEqual([1, 3]);
    expect(c3d.warnings.map((w) => w.code)).toEqual(['C3D_FIRST_FRAME']);
  });

  it('gives a partial result with a warning when the file ends inside the data, and a ParseError when no frame is complete', () => {
    const dataStart = (readC3d(good, 'g').header.dataStartBlock - 1) * 512;
    const frameBytes = (8 + 4) * 2;
    const partial = readC3d(good.slice(0, dataStart + 2 * frameBytes + 5), 'cut.c3d');
    expect(partial.frameCount).toBe(2);
    expect(partial.warnings.map((w) => w.code)).toEqual(['C3D_TRUNCATED']);
    expect(partial.warnings[0].message).toMatch(/cut\.c3d: byte \d+: file ends inside frame 7; 2 of 3 frames read/);
    const e = parseError(good.slice(0, dataStart + 5));
    expect(e.expected).toMatch(/3 frames of 24 bytes/);
  });
});
