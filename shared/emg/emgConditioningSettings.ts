/**
 * Settings of the EMG conditioning chain, their surface-EMG defaults, validation and methods text.
 */
import { correctedCutoffHz } from './butterworthSos';

/** Butterworth band-pass applied to the raw signal. */
export interface BandPassSettings {
  enabled: boolean;
  /** Lower -3 dB edge, Hz (high-pass part; SENIAM recommends 10-20 Hz for surface EMG). */
  lowHz: number;
  /** Upper -3 dB edge, Hz; must be below half the sample rate. */
  highHz: number;
  /** Prototype order N (scipy convention: a band-pass of order N has 2N poles, N sections). */
  order: number;
}

/** Mains interference notches (fundamental and harmonics). */
export interface NotchSettings {
  enabled: boolean;
  /** Mains frequency, Hz (50 or 60). */
  mainsHz: number;
  /** Number of frequencies notched: mainsHz, 2 mainsHz, ... (those at or above Nyquist are skipped). */
  harmonics: number;
  /** Quality factor (-3 dB width = frequency / q). */
  q: number;
}

/** Linear envelope of the rectified signal. */
export interface EnvelopeSettings {
  /** 'low-pass': Butterworth low-pass of the rectified signal; 'moving-rms': centred moving RMS of the band-passed signal. */
  kind: 'low-pass' | 'moving-rms';
  /** Low-pass cutoff, Hz (kind 'low-pass'). */
  lowPassHz: number;
  /** Low-pass prototype order (kind 'low-pass'). */
  order: number;
  /** Moving RMS window, seconds (kind 'moving-rms'). */
  rmsWindowS: number;
}

/** Every setting of the conditioning chain: offset removal, band-pass, notch, rectification, envelope. */
export interface EmgConditioningSettings {
  /** Subtract the mean of the finite samples first. */
  removeOffset: boolean;
  bandPass: BandPassSettings;
  notch: NotchSettings;
  envelope: EnvelopeSettings;
  /** Run every filter forward and backward (zero phase, magnitude |H|^2); false: causal single pass. */
  zeroPhase: boolean;
  /** When zero-phase, move the design edges so that the two-pass response is -3 dB at the requested cutoffs (Winter 2009, p. 69). */
  correctCutoffForPasses: boolean;
}

/**
 * Surface-EMG defaults: offset removal; band-pass 20-450 Hz, Butterworth order 4, zero-phase, corrected for
 * the two passes (high-pass edge within the 10-20 Hz SENIAM range, Hermens et al. 2000, raised to 20 Hz
 * against movement artefacts; 450 Hz upper edge common practice); notch off; full-wave rectification; linear envelope
 * low-pass 10 Hz, order 2 (one of the envelope cutoffs compared by Hodges & Bui 1996).
 */
export const DEFAULT_EMG_CONDITIONING: Readonly<EmgConditioningSettings> = Object.freeze({
  removeOffset: true,
  bandPass: Object.freeze({ enabled: true, lowHz: 20, highHz: 450, order: 4 }),
  notch: Object.freeze({ enabled: false, mainsHz: 50, harmonics: 3, q: 30 }),
  envelope: Object.freeze({ kind: 'low-pass' as const, lowPassHz: 10, order: 2, rmsWindowS: 0.05 }),
  zeroPhase: true,
  correctCutoffForPasses: true,
});

/**
 * Checks every field of the settings (types and ranges, not the sample rate).
 * @param s - settings to check
 * @throws TypeError for a missing or mistyped field, RangeError for a value out of range (message names field and value)
 */
export function validateConditioning(s: EmgConditioningSettings): void {
  const need = (ok: boolean, what: string, v: unknown): void => {
    if (!ok) throw new RangeError(`EMG conditioning: ${what}, got ${JSON.stringify(v)}`);
  };
  if (!s || typeof s !== 'object' || !s.bandPass || !s.notch || !s.envelope) {
    throw new TypeError('EMG conditioning: settings must have bandPass, notch and envelope objects');
  }
  const bp = s.bandPass;
  need(Number.isInteger(bp.order) && bp.order >= 1 && bp.order <= 12, 'bandPass.order must be an integer from 1 to 12', bp.order);
  need(bp.lowHz > 0 && bp.highHz > bp.lowHz, 'bandPass needs 0 < lowHz < highHz', [bp.lowHz, bp.highHz]);
  need(s.notch.mainsHz > 0, 'notch.mainsHz must be positive', s.notch.mainsHz);
  need(Number.isInteger(s.notch.harmonics) && s.notch.harmonics >= 1, 'notch.harmonics must be a positive integer', s.notch.harmonics);
  need(s.notch.q > 0, 'notch.q must be positive', s.notch.q);
  const env = s.envelope;
  need(env.kind === 'low-pass' || env.kind === 'moving-rms', "envelope.kind must be 'low-pass' or 'moving-rms'", env.kind);
  if (env.kind === 'low-pass') {
    need(env.lowPassHz > 0, 'envelope.lowPassHz must be positive', env.lowPassHz);
    need(Number.isInteger(env.order) && env.order >= 1 && env.order <= 8, 'envelope.order must be an integer from 1 to 8', env.order);
  } else {
    need(env.rmsWindowS > 0, 'envelope.rmsWindowS must be positive', env.rmsWindowS);
  }
}

function hz(v: number): string {
  return `${Number(v.toPrecision(4))} Hz`;
}

/**
 * One paragraph describing the conditioning chain for a methods section (filter type, order, cutoffs,
 * phase, correction), as the ISEK reporting standard asks (Merletti 1999).
 * @param s - settings
 * @param rateHz - optional sample rate, Hz: when given, the corrected design cutoffs are stated too
 * @returns methods text
 */
export function describeConditioning(s: EmgConditioningSettings, rateHz?: number): string {
  const phase = s.zeroPhase ? 'zero-phase, run forward and backward' : 'causal, single pass';
  const corrected = s.zeroPhase && s.correctCutoffForPasses;
  const parts: string[] = [];
  if (s.removeOffset) parts.push('offset-corrected (mean subtracted)');
  if (s.bandPass.enabled) {
    let t = `band-pass filtered at ${hz(s.bandPass.lowHz)}-${hz(s.bandPass.highHz)} (Butterworth, prototype order ${s.bandPass.order}, ${2 * s.bandPass.order} poles, ${phase}`;
    if (corrected) {
      t += ', edges corrected for two passes so that the combined response is -3 dB at the stated cut-offs (Winter 2009, p. 69)';
      if (rateHz && rateHz > 2 * s.bandPass.highHz) {
        const d = correctedCutoffHz(s.bandPass.order, [s.bandPass.lowHz, s.bandPass.highHz], rateHz, 'bandpass', 2);
        t += `; design edges ${hz(d[0])} and ${hz(d[1])} at ${hz(rateHz)} sampling`;
      }
    }
    parts.push(`${t})`);
  }
  if (s.notch.enabled) {
    parts.push(`notch filtered at ${hz(s.notch.mainsHz)} and harmonics up to ${s.notch.harmonics} x ${hz(s.notch.mainsHz)} (second-order IIR notches, Q = ${s.notch.q}, ${phase})`);
  }
  parts.push('full-wave rectified');
  if (s.envelope.kind === 'low-pass') {
    parts.push(`low-pass filtered at ${hz(s.envelope.lowPassHz)} (Butterworth, order ${s.envelope.order}, ${phase}${corrected ? ', corrected for two passes' : ''}) to form a linear envelope`);
  } else {
    parts.push(`reduced to a moving RMS amplitude over ${Number((s.envelope.rmsWindowS * 1000).toPrecision(4))} ms centred windows as the envelope`);
  }
  const last = parts.pop();
  return `EMG signals were ${parts.join(', ')}${parts.length ? ' and ' : ''}${last}.`;
}
