/**
 * A small exact cache of a model's discretisations, keyed by the step dtS (internal to `shared/ssm/`).
 *
 * Sample times computed as k / rate give steps that differ in their last bits from sample to sample
 * (about 20 distinct values over a million samples at common rates, alternating), so "re-discretise
 * when the step changes" would call `discretize` on about half of all samples. Four slots, refilled
 * round-robin, hold every step seen recently; a hit returns exactly what `discretize(dtS)` returned
 * for that same dtS, so results are bit-identical to calling it every step. `discretize` must be a
 * pure function of dtS (as every model in this folder is).
 */
import type { StateSpaceModel } from './stateSpaceModel';

const SLOTS = 4;

/** Four-slot cache of F (n*n), u (n) and Q (n*n) by exact step. */
export class DiscretizationCache {
  /** Steps held, NaN when empty. */
  readonly keys = new Float64Array(SLOTS).fill(NaN);
  /** F of slot s at offset s*n*n. */
  readonly F: Float64Array;
  /** u of slot s at offset s*n. */
  readonly u: Float64Array;
  /** Q of slot s at offset s*n*n. */
  readonly Q: Float64Array;
  private next = 0;
  private readonly Fw: Float64Array;
  private readonly uw: Float64Array;
  private readonly Qw: Float64Array;

  /** @param model - the model whose `discretize` is cached (a pure function of the step) */
  constructor(private readonly model: Pick<StateSpaceModel, 'n' | 'discretize'>) {
    const n = model.n;
    this.F = new Float64Array(SLOTS * n * n);
    this.u = new Float64Array(SLOTS * n);
    this.Q = new Float64Array(SLOTS * n * n);
    this.Fw = new Float64Array(n * n);
    this.uw = new Float64Array(n);
    this.Qw = new Float64Array(n * n);
  }

  /**
   * Slot holding the discretisation for `dtS`, calling the model's `discretize` on a miss.
   * @param dtS - the step, s
   * @returns the slot index s (F at s*n*n, u at s*n, Q at s*n*n)
   */
  slot(dtS: number): number {
    const k = this.keys;
    if (k[0] === dtS) return 0;
    if (k[1] === dtS) return 1;
    if (k[2] === dtS) return 2;
    if (k[3] === dtS) return 3;
    const s = this.next;
    this.next = (s + 1) % SLOTS;
    const n = this.model.n, nn = n * n;
    this.model.discretize(dtS, this.Fw, this.uw, this.Qw);
    this.F.set(this.Fw, s * nn);
    this.u.set(this.uw, s * n);
    this.Q.set(this.Qw, s * nn);
    k[s] = dtS;
    return s;
  }
}
