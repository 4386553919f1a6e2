/**
 * Test helper: a small C3D file description (two points, two analog channels at 2 samples per frame,
 * frames 5 to 7 at 100 Hz) for any processor type and storage form, for buildC3dBytes.
 */
import type { FixtureProcessor, FixtureRecord, FixtureSpec } from './buildC3dBytes';

/** |POINT:SCALE| of the small file. */
export const SCALE = 0.5;

/** Two points, two analog channels at 2 samples per frame, 3 frames starting at frame 5, 100 Hz. */
export function smallSpec(processor: FixtureProcessor, float: boolean, extra: Partial<FixtureSpec> = {}, extraRecords: FixtureRecord[] = []): FixtureSpec {
  const s = float ? -SCALE : SCALE;
  // Point 1 valid every frame (camera mask 0b0000101, residual 3 steps); point 2 invalid in frame 2.
  const word = (5 << 8) | 3;
  const frames: number[][] = [];
  for (let f = 0; f < 3; f++) {
    const pts = [10 + f, 20, -30, word, f === 1 ? 0 : 40, 50, 60, f === 1 ? -1 : 0];
    // raw analog words: channel A then B, for each of the 2 samples.
    const analog = [100 + f, 2000, 101 + f, 2001];
    const xyz = float ? pts.map((v, i) => (i % 4 === 3 ? v : v * SCALE)) : pts;
    frames.push([...xyz, ...analog]);
  }
  return {
    processor,
    float,
    header: { points: 2, analogPerFrame: 4, firstFrame: 5, lastFrame: 7, scale: s, samplesPerFrame: 2, rateHz: 100 },
    // Parameters before their groups, ANALOG before POINT, a locked name: the order is free.
    records: [
      { kind: 'param', group: 2, name: 'LABELS', type: -1, dims: [5, 2], values: ['EMG1 ', 'FORCE'] },
      { kind: 'param', group: 2, name: 'USED', type: 2, dims: [], values: [2] },
      { kind: 'param', group: 2, name: 'SCALE', type: 4, dims: [2], values: [0.25, -2] },
      { kind: 'param', group: 2, name: 'OFFSET', type: 2, dims: [2], values: [100, 2000] },
      { kind: 'param', group: 2, name: 'GEN_SCALE', type: 4, dims: [], values: [2] },
      { kind: 'param', group: 2, name: 'UNITS', type: -1, dims: [2, 2], values: ['mV', 'N'] },
      { kind: 'param', group: 2, name: 'RATE', type: 4, dims: [], values: [200] },
      { kind: 'group', id: 2, name: 'ANALOG', description: 'analog' },
      { kind: 'group', id: 1, name: 'POINT', description: 'points', locked: true },
      { kind: 'param', group: 1, name: 'USED', type: 2, dims: [], values: [2], locked: true },
      { kind: 'param', group: 1, name: 'SCALE', type: 4, dims: [], values: [s] },
      { kind: 'param', group: 1, name: 'RATE', type: 4, dims: [], values: [100] },
      { kind: 'param', group: 1, name: 'FRAMES', type: 2, dims: [], values: [3] },
      { kind: 'param', group: 1, name: 'LABELS', type: -1, dims: [6, 2], values: [' BALL', 'HAND  '], description: 'marker names' },
      { kind: 'param', group: 1, name: 'UNITS', type: -1, dims: [2], values: ['mm'] },
      ...extraRecords,
    ],
    frames,
    ...extra,
  };
}

