import type { Recording, SignalChannel } from '../recording/types';
import { AnalysisError } from '../errors';
import { parseUpAxis } from '../ssm';
import type { PreparedTrial, StudySettings, TrialFlag, TrialSpec } from './types';
import { reconstructVertical } from './reconstructVertical';
import { detectRelease } from './detectRelease';
import { detectHeightContact, detectImpactContact } from './detectContact';
import { fitConstantAcceleration } from './fitConstantAcceleration';
import { muscleOnset } from './muscleOnset';
import { decimateMean } from './decimateMean';

/** Finds a channel or marker by label, ignoring case and surrounding blanks. */
function byLabel<T extends { label: string }>(items: readonly T[], label: string): T | undefined {
  const want = label.trim().toLowerCase();
  return items.find((x) => x.label.trim().toLowerCase() === want);
}

/** Linear interpolation over NaN gaps (ends held at the nearest finite value); a new array. */
function fillNaN(values: Float64Array): Float64Array {
  const out = Float64Array.from(values);
  const T = out.length;
  let last = -1;
  for (let i = 0; i < T; i++) {
    if (!Number.isFinite(out[i])) continue;
    if (last < 0) out.fill(out[i], 0, i);
    else if (i - last > 1) for (let j = last + 1; j < i; j++) out[j] = out[last] + ((out[i] - out[last]) * (j - last)) / (i - last);
    last = i;
  }
  if (last >= 0) out.fill(out[last], last + 1);
  return out;
}

/**
 * The expensive, cached part of a trial's analysis: vertical object trajectory by the RTS smoother (noise
 * fitted), release, measured contact, constant acceleration fitted over the motion, and EMG onsets per
 * muscle in the window release - lead .. contact + margin. Data problems become flags (the trial still
 * returns); only a trial with no usable object trajectory throws.
 *
 * @param trial - the trial's spec
 * @param recording - its kinematics recording (markers; EMG too when in the same file)
 * @param settings - study settings
 * @param emgRecording - separate EMG recording (its clock shifted by trial.emgOffsetS), optional
 * @returns the prepared trial
 * @throws AnalysisError `no-markers` / `no-object-marker` / `too-few-samples` when the object cannot be followed
 */
export function prepareTrial(trial: TrialSpec, recording: Recording, settings: StudySettings, emgRecording?: Recording): PreparedTrial {
  const flags: TrialFlag[] = [];
  const stream = recording.markers;
  if (!stream || stream.frameCount === 0) throw new AnalysisError('no-markers', `${recording.source}: no marker data`);
  const obj = byLabel(stream.markers, settings.objectMarker);
  if (!obj) {
    throw new AnalysisError('no-object-marker', `${recording.source}: no marker '${settings.objectMarker}' (markers: ${stream.markers.map((m) => m.label).join(', ')})`);
  }
  const up = parseUpAxis(settings.upAxis);
  const T = stream.frameCount;
  let timesS: Float64Array;
  if (stream.timesS) timesS = Float64Array.from(stream.timesS);
  else {
    timesS = new Float64Array(T);
    for (let i = 0; i < T; i++) timesS[i] = stream.startS + i / stream.rateHz;
  }
  const axisOf = (m: { x: Float64Array; y: Float64Array; z: Float64Array }): Float64Array => (up.index === 0 ? m.x : up.index === 1 ? m.y : m.z);
  /** up.sign * axis values + offsetM, as a new array (a plain loop: no per-sample callback). */
  const heightOf = (m: { x: Float64Array; y: Float64Array; z: Float64Array }, offsetM: number): Float64Array => {
    const src = axisOf(m);
    const out = new Float64Array(src.length);
    for (let i = 0; i < src.length; i++) out[i] = up.sign * src[i];
    if (offsetM !== 0) for (let i = 0; i < src.length; i++) out[i] += offsetM;
    return out;
  };
  const heightAll = heightOf(obj, 0);
  let observed = 0;
  for (let i = 0; i < T; i++) if (Number.isFinite(heightAll[i])) observed++;
  if (observed < 10) throw new AnalysisError('too-few-samples', `${recording.source}: marker '${obj.label}' has ${observed} valid samples`);
  if (observed < 0.8 * T) flags.push({ code: 'many-gaps', severity: 'warning', message: `${T - observed} of ${T} samples of '${obj.label}' missing` });

  // target height per sample
  let targetAll: Float64Array;
  if (settings.target.kind === 'marker') {
    const tm = byLabel(stream.markers, settings.target.marker);
    if (!tm) throw new AnalysisError('no-target-marker', `${recording.source}: no target marker '${settings.target.marker}'`);
    const off = settings.target.offsetM ?? 0;
    targetAll = fillNaN(heightOf(tm, off));
    if (!Number.isFinite(targetAll[0])) throw new AnalysisError('no-target-marker', `${recording.source}: target marker '${tm.label}' has no valid samples`);
  } else targetAll = new Float64Array(T).fill(settings.target.heightM);

  // raw crossing bounds the smoothing window: the hand stops the object, so samples long after contact are cut
  const filled = fillNaN(heightAll);
  let firstMove = 0;
  const top = filled[0];
  while (firstMove < T && top - filled[firstMove] < 0.02) firstMove++;
  const rawContact = detectHeightContact(timesS, filled, targetAll, timesS[Math.min(firstMove, T - 1)]);
  let end = T;
  if (rawContact !== null) {
    const cut = rawContact + 0.05;
    while (end > 10 && timesS[end - 1] > cut) end--;
  }
  const t = timesS.subarray(0, end);
  const height = heightAll.subarray(0, end);
  const target = targetAll.subarray(0, end);
  const rec = reconstructVertical(height, t, settings.reconstruction);

  const releaseS = detectRelease(t, rec.smoothedState, settings.release.speedThresholdMps, settings.release.sustainMs, rawContact ?? Infinity);
  if (releaseS === null) flags.push({ code: 'no-release', severity: 'error', message: 'the object never starts moving down' });

  let contactS: number | null = null;
  if (releaseS !== null) {
    if (settings.impactChannel) {
      const ch = byLabel(recording.signals, settings.impactChannel.channel) ?? (emgRecording ? byLabel(emgRecording.signals, settings.impactChannel.channel) : undefined);
      if (!ch) flags.push({ code: 'no-impact-channel', severity: 'error', message: `no channel '${settings.impactChannel.channel}'` });
      else contactS = detectImpactContact(ch.values, ch.rateHz, ch.startS, settings.impactChannel.threshold, releaseS);
    } else {
      const hs = new Float64Array(end);
      for (let i = 0; i < end; i++) hs[i] = rec.smoothedState[i * 3];
      contactS = detectHeightContact(t, hs, target, releaseS);
    }
    if (contactS === null) flags.push({ code: 'no-contact', severity: 'error', message: 'the object never reaches the target' });
  }
  let fittedAcc = NaN;
  let fittedSd = NaN;
  if (releaseS !== null && contactS !== null) {
    const skip = (contactS - releaseS) / 4; // leaves out the launch or throw at the start of the motion
    const fit = fitConstantAcceleration(t, height, releaseS + skip, contactS);
    fittedAcc = fit.accMps2;
    fittedSd = fit.sdMps2;
  }

  // EMG onsets per muscle
  const onsets: PreparedTrial['onsets'] = {};
  const envelopes: PreparedTrial['envelopes'] = {};
  const windowFrom = (releaseS ?? t[0]) - settings.onsetLeadMs / 1000;
  const windowTo = (contactS ?? timesS[T - 1]) + settings.onsetMarginMs / 1000;
  for (const spec of settings.emgChannels) {
    let ch: SignalChannel | undefined = byLabel(recording.signals, spec.channel);
    let offsetS = 0;
    if (!ch && emgRecording) {
      ch = byLabel(emgRecording.signals, spec.channel);
      offsetS = trial.emgOffsetS ?? 0;
    }
    if (!ch) {
      flags.push({ code: 'no-emg-channel', severity: 'error', muscle: spec.muscle, message: `no EMG channel '${spec.channel}'` });
      continue;
    }
    try {
      const r = muscleOnset(ch, offsetS, settings, { fromS: windowFrom, toS: windowTo });
      onsets[spec.muscle] = r.result;
      const dec = decimateMean(r.envelope, ch.rateHz, r.startS, 4000);
      envelopes[spec.muscle] = dec;
      if (r.result.onsetS === null) flags.push({ code: 'no-onset', severity: 'error', muscle: spec.muscle, message: `no onset of ${spec.muscle} between ${windowFrom.toFixed(3)} and ${windowTo.toFixed(3)} s` });
      // the detector's quality flags (baseline too active, clipping, onset at the window edge...) as warnings
      for (const f of r.result.flags) {
        if (f !== 'no-onset') flags.push({ code: `onset-${f}`, severity: 'warning', muscle: spec.muscle, message: `${spec.muscle}: onset detector flag '${f}'` });
      }
    } catch (err) {
      flags.push({ code: 'emg-error', severity: 'error', muscle: spec.muscle, message: err instanceof Error ? err.message : String(err) });
    }
  }
  return {
    trial,
    timesS: Float64Array.from(t),
    heightM: Float64Array.from(height),
    smoothedState: rec.smoothedState,
    smoothedCov: rec.smoothedCov,
    filteredState: rec.filteredState,
    filteredCov: rec.filteredCov,
    targetHeightM: Float64Array.from(target),
    noise: rec.noise,
    releaseS,
    contactS,
    fittedAccMps2: fittedAcc,
    fittedAccSdMps2: fittedSd,
    motionDurationS: releaseS !== null && contactS !== null ? contactS - releaseS : NaN,
    contactSpeedMps: contactS !== null ? speedAt(t, rec.smoothedState, contactS) : NaN,
    onsets,
    envelopes,
    flags,
  };
}

function speedAt(timesS: Float64Array, state: Float64Array, tS: number): number {
  let i = 0;
  while (i < timesS.length - 1 && timesS[i + 1] < tS) i++;
  return Math.abs(state[i * 3 + 1]);
}
