/**
 * Seeded synthetic EMG trials with known onsets, for the accuracy benchmark and detector tests.
 * Invented data in Forecatch's own scenario: surface EMG of a forearm flexor recorded at 2 kHz in the
 * motorised vertical rail lab while the ball is driven down; nothing here comes from a real person.
 */
import { butterworthSos, sosFilt } from '../../shared/emg';

/** Seeded uniform [0, 1) generator (mulberry32) with a Gaussian draw (Box-Muller). */
export class SeededRandom {
  private a: number;
  private spare = NaN;
  constructor(seed: number) {
    this.a = seed >>> 0;
  }
  uniform(): number {
    this.a = (this.a + 0x6d2b79f5) >>> 0;
    let t = this.a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }
  between(lo: number, hi: number): number {
    return lo + (hi - lo) * this.uniform();
  }
  gaussian(): number {
    if (this.spare === this.spare) {
      const s = this.spare;
      this.spare = NaN;
      return s;
    }
    let u = 0;
    while (u === 0) u = this.uniform();
    const v = this.uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }
}

/** What a synthetic trial contains. */
export interface SyntheticTrialSpec {
  rateHz: number;
  durationS: number;
  /** Burst-plateau power over baseline-noise power, dB; null for a pure-baseline trial. */
  snrDb: number | null;
  /** True onset (start of the amplitude ramp), s; ignored for pure-baseline trials. */
  onsetS: number;
  /** Rise time of the linear amplitude ramp, s. */
  riseS: number;
  /** Burst length including the rise, s. */
  burstS: number;
  /** Low-frequency movement artefact: Gaussian-shaped transient. */
  artefact: { atS: number; widthS: number; amplitude: number } | null;
  /** Mains hum: amplitude of the fundamental in baseline-RMS units (3rd harmonic at a third of it). */
  hum: { mainsHz: number; amplitude: number } | null;
}

function unitRms(x: Float64Array): void {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i] * x[i];
  const r = Math.sqrt(s / x.length);
  for (let i = 0; i < x.length; i++) x[i] /= r;
}

/**
 * Builds one trial: baseline noise (white Gaussian through a 10-500 Hz band, the invented amplifier's band,
 * unit RMS), plus a burst of band-limited noise (30-250 Hz, unit RMS) times a trapezoidal amplitude
 * (linear rise from the onset, plateau, linear fall), scaled to the SNR, plus the optional artefact and hum.
 * @param spec - trial description
 * @param rng - seeded generator
 * @returns samples in baseline-RMS units, starting at t = 0
 */
export function makeSyntheticTrial(spec: SyntheticTrialSpec, rng: SeededRandom): Float64Array {
  const n = Math.round(spec.durationS * spec.rateHz);
  const noise = new Float64Array(n);
  for (let i = 0; i < n; i++) noise[i] = rng.gaussian();
  sosFilt(butterworthSos(2, [10, 500], spec.rateHz, 'bandpass'), noise, undefined, noise);
  unitRms(noise);
  const x = noise;
  if (spec.snrDb !== null) {
    const burst = new Float64Array(n);
    for (let i = 0; i < n; i++) burst[i] = rng.gaussian();
    sosFilt(butterworthSos(2, [30, 250], spec.rateHz, 'bandpass'), burst, undefined, burst);
    unitRms(burst);
    const amp = 10 ** (spec.snrDb / 20);
    for (let i = 0; i < n; i++) {
      const t = i / spec.rateHz - spec.onsetS;
      let a = 0;
      if (t >= 0 && t < spec.burstS) {
        a = Math.min(1, t / spec.riseS, (spec.burstS - t) / spec.riseS);
      }
      x[i] += amp * a * burst[i];
    }
  }
  if (spec.artefact) {
    const { atS, widthS, amplitude } = spec.artefact;
    for (let i = 0; i < n; i++) {
      const u = (i / spec.rateHz - atS) / widthS;
      x[i] += amplitude * Math.exp(-0.5 * u * u);
    }
  }
  if (spec.hum) {
    const ph = rng.between(0, 2 * Math.PI);
    for (let i = 0; i < n; i++) {
      const w = 2 * Math.PI * spec.hum.mainsHz * (i / spec.rateHz);
      x[i] += spec.hum.amplitude * (Math.sin(w + ph) + Math.sin(3 * w + ph) / 3);
    }
  }
  return x;
}

/** One benchmark trial: its description, samples, and the search window used on it. */
export interface SyntheticTrial {
  spec: SyntheticTrialSpec;
  signal: Float64Array;
  window: { fromS: number; toS: number };
}

/**
 * A seeded set of trials at one SNR: `bursts` trials with an onset (a third with a movement artefact, a third
 * with 50 Hz hum, independently), and `pure` pure-baseline trials (with the same artefact and hum mix).
 * Recording 0-2.5 s at 2 kHz; search window 0.3-2.2 s (baseline = its first 0.3 s); onset uniform in 0.9-1.7 s;
 * rise 20-50 ms; burst 0.3-0.6 s; artefacts 8-25 baseline RMS, 30-80 ms wide, anywhere in the search window.
 * @param snrDb - SNR of the burst trials, dB
 * @param bursts - number of trials with a burst
 * @param pure - number of pure-baseline trials
 * @param seed - generator seed
 * @returns the trials
 */
export function makeSyntheticSet(snrDb: number, bursts: number, pure: number, seed: number): SyntheticTrial[] {
  const rng = new SeededRandom(seed);
  const trials: SyntheticTrial[] = [];
  for (let k = 0; k < bursts + pure; k++) {
    const hasBurst = k < bursts;
    const spec: SyntheticTrialSpec = {
      rateHz: 2000,
      durationS: 2.5,
      snrDb: hasBurst ? snrDb : null,
      onsetS: rng.between(0.9, 1.7),
      riseS: rng.between(0.02, 0.05),
      burstS: rng.between(0.3, 0.6),
      artefact: rng.uniform() < 1 / 3 ? { atS: rng.between(0.3, 2.2), widthS: rng.between(0.03, 0.08), amplitude: rng.between(8, 25) * (rng.uniform() < 0.5 ? -1 : 1) } : null,
      hum: rng.uniform() < 1 / 3 ? { mainsHz: 50, amplitude: rng.between(0.5, 2) } : null,
    };
    trials.push({ spec, signal: makeSyntheticTrial(spec, rng), window: { fromS: 0.3, toS: 2.2 } });
  }
  return trials;
}
