import { ParseError } from '../errors';
import type { AnalysisHypothesis, StudySettings, TrialSpec } from '../analysis/types';
import type { OnsetEditLike } from '../analysis/emgTypes';
import { defaultStudySettings } from '../analysis/defaultSettings';
import { migrateStudy } from './migrateStudy';
import { STUDY_SCHEMA_VERSION, type StudyFile } from './studyFile';

type Json = Record<string, unknown>;

/** A study-file problem at a JSON path (e.g. `$.settings.cutoff.delayMs`); a ParseError with the path. */
export class StudyFileError extends ParseError {
  readonly jsonPath: string;
  constructor(file: string, line: number, jsonPath: string, expected: string, found: unknown) {
    super({ file, line, column: jsonPath }, expected, found === undefined ? 'nothing' : JSON.stringify(found)?.slice(0, 80));
    this.name = 'StudyFileError';
    this.jsonPath = jsonPath;
  }
}

/** 1-based line of the first `"key":` of the path's last named key in the text (1 when not found). */
function lineOf(text: string, path: string): number {
  const keys = path.match(/\.([A-Za-z_][\w]*)/g);
  if (!keys) return 1;
  const key = keys[keys.length - 1].slice(1);
  const at = text.indexOf(`"${key}"`);
  return at < 0 ? 1 : text.slice(0, at).split('\n').length;
}

const HYPOTHESIS_KINDS = ['constant-velocity', 'gravity', 'fitted-gravity', 'free-acceleration', 'drag', 'bayesian-observer'];
const UP_AXES = ['+x', '-x', '+y', '-y', '+z', '-z'];

/**
 * Parses and validates a study file (any schema version; older ones are migrated). Missing settings take
 * their defaults (defaultStudySettings); present ones must have the right type and range.
 *
 * @param text - file content
 * @param fileName - name for messages
 * @returns the study at the current schema version
 * @throws ParseError for invalid JSON (with line), StudyFileError (a ParseError) naming the JSON path and line
 *   of the first invalid field
 */
export function parseStudyFile(text: string, fileName: string): StudyFile {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (err) {
    const m = /position (\d+)/.exec(String(err));
    const line = m ? text.slice(0, Number(m[1])).split('\n').length : 1;
    throw new ParseError({ file: fileName, line }, 'valid JSON', err instanceof Error ? err.message : String(err));
  }
  if (!raw || typeof raw !== 'object' || Array.isArray(raw)) throw new StudyFileError(fileName, 1, '$', 'a JSON object', raw);
  const doc = migrateStudy(raw as Json, fileName);
  const fail = (path: string, expected: string, found: unknown): never => {
    throw new StudyFileError(fileName, lineOf(text, path), path, expected, found);
  };
  const str = (v: unknown, path: string, allowEmpty = false): string => {
    if (typeof v !== 'string' || (!allowEmpty && v.trim() === '')) fail(path, allowEmpty ? 'a string' : 'a non-empty string', v);
    return v as string;
  };
  const num = (v: unknown, path: string, min = -Infinity, max = Infinity): number => {
    if (typeof v !== 'number' || !(v >= min) || !(v <= max)) fail(path, `a number in [${min}, ${max}]`, v);
    return v as number;
  };
  const obj = (v: unknown, path: string): Json => {
    if (!v || typeof v !== 'object' || Array.isArray(v)) fail(path, 'an object', v);
    return v as Json;
  };
  const arr = (v: unknown, path: string): unknown[] => {
    if (!Array.isArray(v)) fail(path, 'an array', v);
    return v as unknown[];
  };

  const s = obj(doc.settings ?? {}, '$.settings');
  const d = defaultStudySettings();
  const settings: StudySettings = { ...d, ...(s as Partial<StudySettings>) };
  str(settings.objectMarker, '$.settings.objectMarker');
  const target = obj(settings.target, '$.settings.target');
  if (target.kind === 'marker') str(target.marker, '$.settings.target.marker');
  else if (target.kind === 'height') num(target.heightM, '$.settings.target.heightM');
  else fail('$.settings.target.kind', "'marker' or 'height'", target.kind);
  if (!UP_AXES.includes(settings.upAxis)) fail('$.settings.upAxis', UP_AXES.join(' | '), settings.upAxis);
  arr(settings.emgChannels, '$.settings.emgChannels').forEach((c, i) => {
    const o = obj(c, `$.settings.emgChannels[${i}]`);
    str(o.channel, `$.settings.emgChannels[${i}].channel`);
    str(o.muscle, `$.settings.emgChannels[${i}].muscle`);
  });
  const hyps = arr(settings.hypotheses, '$.settings.hypotheses');
  if (hyps.length === 0) fail('$.settings.hypotheses', 'at least one hypothesis', hyps);
  const ids = new Set<string>();
  hyps.forEach((h, i) => {
    const o = obj(h, `$.settings.hypotheses[${i}]`) as unknown as AnalysisHypothesis;
    const id = str(o.id, `$.settings.hypotheses[${i}].id`);
    if (ids.has(id)) fail(`$.settings.hypotheses[${i}].id`, 'a unique id', id);
    ids.add(id);
    if (!HYPOTHESIS_KINDS.includes(o.kind)) fail(`$.settings.hypotheses[${i}].kind`, HYPOTHESIS_KINDS.join(' | '), o.kind);
    if (o.gMps2 !== undefined) num(o.gMps2, `$.settings.hypotheses[${i}].gMps2`, 0, 1000);
    if (o.dragPerM !== undefined) num(o.dragPerM, `$.settings.hypotheses[${i}].dragPerM`, 0, 100);
    if (o.priorGMps2 !== undefined) num(o.priorGMps2, `$.settings.hypotheses[${i}].priorGMps2`, 0, 1000);
  });
  const cut = obj(settings.cutoff, '$.settings.cutoff');
  if (cut.kind === 'onset-minus-delay') num(cut.delayMs, '$.settings.cutoff.delayMs', 0, 2000);
  else if (cut.kind === 'after-release') num(cut.afterMs, '$.settings.cutoff.afterMs', 0, 10000);
  else if (cut.kind !== 'onset') fail('$.settings.cutoff.kind', "'onset-minus-delay' | 'after-release' | 'onset'", cut.kind);
  if (settings.stateSource !== 'smoothed' && settings.stateSource !== 'filtered') fail('$.settings.stateSource', "'smoothed' | 'filtered'", settings.stateSource);
  num(settings.onsetLeadMs, '$.settings.onsetLeadMs', 0, 10000);
  num(settings.onsetMarginMs, '$.settings.onsetMarginMs', 0, 10000);
  num(settings.release?.speedThresholdMps, '$.settings.release.speedThresholdMps', 0, 100);
  num(settings.release?.sustainMs, '$.settings.release.sustainMs', 0, 10000);
  num(settings.gravityGrid?.points, '$.settings.gravityGrid.points', 3, 10000);
  num(settings.gravityGrid?.maxG, '$.settings.gravityGrid.maxG', 0.01, 100);
  num(settings.priorWidthGrid?.points, '$.settings.priorWidthGrid.points', 3, 10000);
  num(settings.priorWidthGrid?.minMps2, '$.settings.priorWidthGrid.minMps2', 1e-9, 1e9);
  num(settings.priorWidthGrid?.maxMps2, '$.settings.priorWidthGrid.maxMps2', settings.priorWidthGrid.minMps2, 1e9);
  arr(settings.delaySweepMs, '$.settings.delaySweepMs').forEach((v, i) => num(v, `$.settings.delaySweepMs[${i}]`, 0, 2000));
  num(settings.bootstrap?.replicates, '$.settings.bootstrap.replicates', 0, 1e6);
  num(settings.bootstrap?.seed, '$.settings.bootstrap.seed');
  const rk = obj(settings.reconstruction, '$.settings.reconstruction');
  if (!['free-acceleration', 'fitted-gravity', 'gravity'].includes(String(rk.kind))) fail('$.settings.reconstruction.kind', "'free-acceleration' | 'fitted-gravity' | 'gravity'", rk.kind);
  const rn = obj(rk.noise, '$.settings.reconstruction.noise');
  if (rn.kind === 'fixed') {
    num(rn.qIntensity, '$.settings.reconstruction.noise.qIntensity', 0);
    num(rn.measurementVarM2, '$.settings.reconstruction.noise.measurementVarM2', 0);
  } else if (rn.kind !== 'fitted') fail('$.settings.reconstruction.noise.kind', "'fitted' | 'fixed'", rn.kind);
  if (settings.impactChannel !== undefined) {
    const ic = obj(settings.impactChannel, '$.settings.impactChannel');
    str(ic.channel, '$.settings.impactChannel.channel');
    num(ic.threshold, '$.settings.impactChannel.threshold', 0);
  }
  obj(settings.onset, '$.settings.onset');
  obj(settings.conditioning, '$.settings.conditioning');

  const trialIds = new Set<string>();
  const trials: TrialSpec[] = arr(doc.trials ?? [], '$.trials').map((t, i) => {
    const p = `$.trials[${i}]`;
    const o = obj(t, p);
    const id = str(o.id, `${p}.id`);
    if (trialIds.has(id)) fail(`${p}.id`, 'a unique trial id', id);
    trialIds.add(id);
    const cov = obj(o.covariates ?? {}, `${p}.covariates`);
    for (const [k, v] of Object.entries(cov)) if (typeof v !== 'number' && typeof v !== 'string') fail(`${p}.covariates.${k}`, 'a number or string', v);
    if (o.excluded !== undefined && typeof o.excluded !== 'boolean') fail(`${p}.excluded`, 'true or false', o.excluded);
    return {
      id,
      subject: str(o.subject, `${p}.subject`),
      condition: str(o.condition, `${p}.condition`, true),
      file: str(o.file, `${p}.file`),
      emgFile: o.emgFile === undefined ? undefined : str(o.emgFile, `${p}.emgFile`),
      emgOffsetS: o.emgOffsetS === undefined ? undefined : num(o.emgOffsetS, `${p}.emgOffsetS`),
      excluded: o.excluded === true,
      excludeReason: o.excludeReason === undefined ? undefined : str(o.excludeReason, `${p}.excludeReason`, true),
      note: o.note === undefined ? undefined : str(o.note, `${p}.note`, true),
      covariates: cov as Record<string, number | string>,
    };
  });
  const j = obj(doc.journal ?? { edits: [], cursor: 0 }, '$.journal');
  const edits = arr(j.edits, '$.journal.edits').map((e, i) => {
    const p = `$.journal.edits[${i}]`;
    const o = obj(e, p);
    str(o.trialId, `${p}.trialId`);
    str(o.muscle, `${p}.muscle`);
    if (!['accept', 'move', 'invalidate', 'restore'].includes(String(o.action))) fail(`${p}.action`, "'accept' | 'move' | 'invalidate' | 'restore'", o.action);
    if (o.action === 'move') num(o.toS, `${p}.toS`);
    return o as unknown as OnsetEditLike;
  });
  const cursor = num(j.cursor ?? edits.length, '$.journal.cursor', 0, edits.length);
  if (!Number.isInteger(cursor)) fail('$.journal.cursor', 'an integer', cursor);
  return {
    schemaVersion: STUDY_SCHEMA_VERSION,
    name: typeof doc.name === 'string' ? doc.name : '',
    description: typeof doc.description === 'string' ? doc.description : undefined,
    savedWith: typeof doc.savedWith === 'string' ? doc.savedWith : undefined,
    settings,
    trials,
    journal: { edits, cursor },
  };
}
