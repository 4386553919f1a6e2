/**
 * Test helper: a C3D file's point trajectories concatenated into flat arrays, point-major:
 * coordinate (p, axis, f) at (p * 3 + axis) * frameCount + f; residual and camera mask (p, f) at p * frameCount + f.
 */
import type { C3dFile } from '../../../shared/io/c3d';

export function flatPoints(c3d: C3dFile): { xyz: Float32Array; residual: Float32Array; cameraMask: Uint8Array } {
  const F = c3d.frameCount;
  const P = c3d.points.trajectories.length;
  const xyz = new Float32Array(P * 3 * F);
  const residual = new Float32Array(P * F);
  const cameraMask = new Uint8Array(P * F);
  c3d.points.trajectories.forEach((t, p) => {
    xyz.set(t.x, (p * 3) * F);
    xyz.set(t.y, (p * 3 + 1) * F);
    xyz.set(t.z, (p * 3 + 2) * F);
    residual.set(t.residual, p * F);
    cameraMask.set(t.cameraMask, p * F);
  });
  return { xyz, residual, cameraMask };
}
