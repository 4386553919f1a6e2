/**
 * The C3D standard's published sample sets (c3d.org sample files "sample01" and "sample02"), read in place
 * from ../shared/reference/c3d-org-samples/. Each set stores one recording in all six variants (Intel, DEC,
 * SGI/MIPS x integer, float); the header facts below are the table in ../shared/reference/README.md.
 */
import { describe, expect, it } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { readC3d, c3dToRecording, type C3dFile } from '../../../shared/io/c3d';
import { flatPoints } from './flatPoints';

const root = fileURLToPath(new URL('../../../../shared/reference/c3d-org-samples/', import.meta.url));
const present = existsSync(root);
if (!present) {
  console.warn(`C3D reference tests SKIPPED: folder ${root} (../shared/reference/c3d-org-samples/ from the repo root) is absent`);
}

interface SetFacts {
  dir: string;
  files: Record<string, { processor: 'intel' | 'dec' | 'sgi'; storage: 'integer' | 'float' }>;
  points: number;
  analog: number;
  firstFrame: number;
  lastFrame: number;
  pointRateHz: number;
  analogRateHz: number;
  absScale: number;
  dataStart: number;
}

// Header facts: ../shared/reference/README.md, table "Header facts" (sample02's also in its published notes).
const sets: SetFacts[] = [
  {
    dir: 'sample01',
    files: {
      'Eb015pi.c3d': { processor: 'intel', storage: 'integer' },
      'Eb015pr.c3d': { processor: 'intel', storage: 'float' },
      'Eb015si.c3d': { processor: 'sgi', storage: 'integer' },
      'Eb015sr.c3d': { processor: 'sgi', storage: 'float' },
      'Eb015vi.c3d': { processor: 'dec', storage: 'integer' },
      'Eb015vr.c3d': { processor: 'dec', storage: 'float' },
    },
    points: 26,
    analog: 16,
    firstFrame: 1,
    lastFrame: 450,
    pointRateHz: 50,
    analogRateHz: 200,
    absScale: 0.0833,
    dataStart: 11,
  },
  {
    dir: 'sample02',
    files: {
      'pc_int.c3d': { processor: 'intel', storage: 'integer' },
      'pc_real.c3d': { processor: 'intel', storage: 'float' },
      'sgi_int.c3d': { processor: 'sgi', storage: 'integer' },
      'sgi_real.c3d': { processor: 'sgi', storage: 'float' },
      'dec_int.c3d': { processor: 'dec', storage: 'integer' },
      'dec_real.c3d': { processor: 'dec', storage: 'float' },
    },
    points: 36,
    analog: 16,
    firstFrame: 1,
    lastFrame: 89,
    pointRateHz: 50,
    analogRateHz: 200,
    absScale: 0.28,
    dataStart: 13,
  },
];

function load(dir: string, name: string): C3dFile {
  return readC3d(new Uint8Array(readFileSync(join(root, dir, name))), name);
}

describe.skipIf(!present)('c3d.org sample files (../shared/reference/c3d-org-samples/)', () => {
  for (const set of sets) {
    describe(set.dir, () => {
      const files = present ? Object.keys(set.files).map((name) => ({ name, c3d: load(set.dir, name) })) : [];

      it('each variant declares the processor type and storage its file name says (README: pi/pr/si/sr/vi/vr, pc/sgi/dec x int/real)', () => {
        for (const { name, c3d } of files) {
          expect({ name, processor: c3d.processor, storage: c3d.storage }).toEqual({ name, ...set.files[name] });
          expect(c3d.warnings).toEqual([]);
        }
      });

      it('matches the README header facts: points, analog channels, frames, rates, |POINT:SCALE|, data start', () => {
        for (const { name, c3d } of files) {
          const facts = {
            name,
            points: c3d.points.labels.length,
            headerPoints: c3d.header.pointCount,
            analog: c3d.analog.channels.length,
            firstFrame: c3d.firstFrame,
            lastFrame: c3d.firstFrame + c3d.frameCount - 1,
            pointRateHz: c3d.points.rateHz,
            analogRateHz: c3d.analog.rateHz,
            dataStart: c3d.header.dataStartBlock,
          };
          expect(facts).toEqual({
            name,
            points: set.points,
            headerPoints: set.points,
            analog: set.analog,
            firstFrame: set.firstFrame,
            lastFrame: set.lastFrame,
            pointRateHz: set.pointRateHz,
            analogRateHz: set.analogRateHz,
            dataStart: set.dataStart,
          });
          // README gives |POINT:SCALE| to 3-4 significant digits.
          expect(Math.abs(c3d.points.scale)).toBeCloseTo(set.absScale, set.absScale < 0.1 ? 4 : 2);
          expect(Math.abs(c3d.header.scale)).toBeCloseTo(set.absScale, set.absScale < 0.1 ? 4 : 2);
        }
      });

      it('all six variants give identical labels, units, rates and frame counts', () => {
        const ref = files[0].c3d;
        for (const { c3d } of files.slice(1)) {
          expect(c3d.points.labels).toEqual(ref.points.labels);
          expect(c3d.points.units).toEqual(ref.points.units);
          expect(c3d.analog.channels.map((c) => [c.label, c.units])).toEqual(ref.analog.channels.map((c) => [c.label, c.units]));
          expect([c3d.points.rateHz, c3d.analog.rateHz, c3d.frameCount, c3d.firstFrame]).toEqual([
            ref.points.rateHz,
            ref.analog.rateHz,
            ref.frameCount,
            ref.firstFrame,
          ]);
        }
        // Labels are trimmed: no blanks at either end.
        for (const l of ref.points.labels) expect(l).toBe(l.trim());
      });

      it('all six variants give the same points (within one POINT:SCALE step), the same invalid samples and camera masks', () => {
        const refFile = files.find((f) => set.files[f.name].processor === 'intel' && set.files[f.name].storage === 'float')!.c3d;
        const step = Math.abs(refFile.points.scale);
        const ref = { points: flatPoints(refFile) };
        let invalid = 0;
        for (let i = 0; i < ref.points.residual.length; i++) if (Number.isNaN(ref.points.residual[i])) invalid++;
        // A real recording has some occluded samples, and most samples valid.
        expect(invalid).toBeGreaterThan(0);
        expect(invalid).toBeLessThan(ref.points.residual.length / 2);
        for (const { name, c3d: file } of files) {
          const c3d = { points: flatPoints(file) };
          let worst = 0;
          for (let i = 0; i < ref.points.xyz.length; i++) {
            const a = ref.points.xyz[i];
            const b = c3d.points.xyz[i];
            expect(Number.isNaN(b), `${name} sample ${i}`).toBe(Number.isNaN(a));
            if (!Number.isNaN(a)) worst = Math.max(worst, Math.abs(a - b));
          }
          expect(worst, name).toBeLessThanOrEqual(step);
          // Camera masks agree, except that sample02's dec_int.c3d as published sets the two lowest camera
          // bits differently in a few samples (96 of 3204); no other mask bit may differ.
          let maskDiffBits = 0;
          let maskDiffCount = 0;
          for (let i = 0; i < ref.points.cameraMask.length; i++) {
            const d = ref.points.cameraMask[i] ^ c3d.points.cameraMask[i];
            maskDiffBits |= d;
            if (d) maskDiffCount++;
          }
          if (name === 'dec_int.c3d') {
            expect(maskDiffBits & ~3, name).toBe(0);
            expect(maskDiffCount).toBe(96);
          } else {
            expect(maskDiffCount, name).toBe(0);
          }
          let worstResidual = 0;
          for (let i = 0; i < ref.points.residual.length; i++) {
            if (!Number.isNaN(ref.points.residual[i])) worstResidual = Math.max(worstResidual, Math.abs(ref.points.residual[i] - c3d.points.residual[i]));
          }
          expect(worstResidual, name).toBeLessThanOrEqual(step);
        }
      });

      it('all six variants give the same analog values (within one raw count: |ANALOG:SCALE x GEN_SCALE|)', () => {
        const ref = files[0].c3d;
        for (const { name, c3d } of files) {
          c3d.analog.channels.forEach((ch, c) => {
            const step = Math.abs(ref.analog.channels[c].scale * ref.analog.genScale);
            const a = ref.analog.channels[c].values;
            expect(ch.values.length).toBe(c3d.frameCount * c3d.analog.samplesPerFrame);
            let worst = 0;
            for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - ch.values[i]));
            expect(worst, `${name} ${ch.label}`).toBeLessThanOrEqual(step * 1.0001);
          });
        }
      });

      it('converts to a Recording in metres on the clock where frame 1 is at 0 s', () => {
        const { c3d } = files[0];
        const rec = c3dToRecording(c3d);
        expect(rec.format).toBe('c3d');
        expect(rec.markers!.markers.map((m) => m.label)).toEqual(c3d.points.labels);
        expect(rec.markers!.startS).toBe((c3d.firstFrame - 1) / c3d.points.rateHz);
        expect(rec.markers!.sourceUnits).toBe('mm');
        const F = c3d.frameCount;
        for (let f = 0; f < F; f += 37) {
          const mm = c3d.points.trajectories[1].z[f];
          const m = rec.markers!.markers[1].z[f];
          if (Number.isNaN(mm)) expect(m).toBeNaN();
          else expect(m).toBeCloseTo(mm / 1000, 9);
        }
        expect(rec.signals.map((s) => s.rateHz)).toEqual(new Array(set.analog).fill(set.analogRateHz));
        expect(rec.events.length).toBe(c3d.header.events.length);
        // Missing samples per marker: the invalid (negative residual word) frames.
        const missing = rec.meta.missingSamples as number[];
        expect(missing.length).toBe(set.points);
        rec.markers!.markers.forEach((m, p) => expect(missing[p]).toBe(m.x.filter((v) => Number.isNaN(v)).length));
        expect(rec.meta).toMatchObject({ processorType: 'intel', storage: set.files[files[0].name].storage, pointRateHz: 50, analogRateHz: 200, firstFrame: 1, lastFrame: set.lastFrame, frames: set.lastFrame });
      });
    });
  }
});
