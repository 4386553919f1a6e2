/**
 * Writes a simulated rail-lab study as real files: per trial a C3D file with the ball and hand markers and
 * an EDF+ file with the EMG, the trial list `trials.csv`, the study file `study.forecatch.json` and a
 * README.txt saying the data are invented.
 */
import { mkdir } from 'node:fs/promises';
import { dirname, join } from 'node:path';
import { atomicWriteFile } from './atomicWrite';
import { writeC3d } from '../../shared/io/c3d/writeC3d';
import { writeEdf } from '../../shared/io/edf/writeEdf';
import { serializeStudy, STUDY_SCHEMA_VERSION, type StudyFile } from '../../shared/study/studyFile';
import { csvCovariate, csvField } from '../../shared/analysis/csvFormat';
import type { SimulatedTrial } from '../../shared/simulate/simulateStudy';
import type { StudySettings, TrialSpec } from '../../shared/analysis/types';
import { FORECATCH_VERSION } from '../../shared/version';

/**
 * Trial list CSV text for trial specs (columns trial, subject, condition, file, emg_file, exclude, note, then
 * the covariates).
 *
 * @param trials - trial specs
 * @returns CSV text
 */
export function trialListCsv(trials: readonly TrialSpec[]): string {
  const covNames = [...new Set(trials.flatMap((t) => Object.keys(t.covariates)))].sort();
  const lines = [['trial', 'subject', 'condition', 'file', 'emg_file', 'exclude', 'note', ...covNames].join(',')];
  for (const t of trials) {
    lines.push(
      [t.id, t.subject, t.condition, t.file, t.emgFile ?? '', t.excluded ? t.excludeReason ?? 'true' : '', t.note ?? '']
        .map(csvField)
        .concat(covNames.map((c) => csvCovariate(t.covariates[c])))
        .join(','),
    );
  }
  return lines.join('\n') + '\n';
}

/**
 * Writes the study files.
 *
 * @param dir - output folder (created)
 * @param trials - simulated trials (recordings in memory)
 * @param settings - study settings
 * @param name - study name
 * @param readme - README text (must say the data are invented)
 * @param onProgress - called after each trial
 * @returns the study file path
 */
export async function writeSimulatedStudy(
  dir: string,
  trials: readonly SimulatedTrial[],
  settings: StudySettings,
  name: string,
  readme: string,
  onProgress?: (done: number, total: number) => void,
): Promise<string> {
  await mkdir(dir, { recursive: true });
  const specs: TrialSpec[] = [];
  let done = 0;
  for (const t of trials) {
    const c3dPath = t.spec.file;
    const edfPath = c3dPath.replace(/\.c3d$/i, '_emg.edf');
    await mkdir(dirname(join(dir, c3dPath)), { recursive: true });
    const kin = { ...t.recording, signals: [], meta: {} };
    await atomicWriteFile(join(dir, c3dPath), writeC3d(kin, { pointUnits: 'mm', description: 'Forecatch simulated rail trial (invented data)' }), { keepBackup: false });
    await atomicWriteFile(join(dir, edfPath), writeEdf(t.recording.signals, { format: 'edf+', recordingInfo: 'Forecatch simulated EMG (invented data)' }), { keepBackup: false });
    specs.push({ ...t.spec, emgFile: edfPath, emgOffsetS: 0 });
    onProgress?.(++done, trials.length);
  }
  const study: StudyFile = {
    schemaVersion: STUDY_SCHEMA_VERSION,
    name,
    description: 'Invented data from the Forecatch rail-lab simulator.',
    savedWith: FORECATCH_VERSION,
    settings,
    trials: specs,
    journal: { edits: [], cursor: 0 },
  };
  const studyPath = join(dir, 'study.forecatch.json');
  await atomicWriteFile(studyPath, serializeStudy(study), { keepBackup: false });
  await atomicWriteFile(join(dir, 'trials.csv'), trialListCsv(specs), { keepBackup: false });
  await atomicWriteFile(join(dir, 'README.txt'), readme, { keepBackup: false });
  return studyPath;
}
