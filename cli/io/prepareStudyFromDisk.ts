/**
 * Reads every trial's recordings (read-only) and prepares it; a trial whose file is missing or unreadable,
 * or whose object cannot be followed, becomes a FailedTrial with the file and the reason, and the rest go on.
 */
import { join } from 'node:path';
import { readRecordingFile } from './readRecordingFile';
import { prepareTrial } from '../../shared/analysis/prepareTrial';
import { serializeError } from '../../shared/errors';
import type { FailedTrial, PreparedTrial } from '../../shared/analysis/types';
import type { StudyFile } from '../../shared/study/studyFile';

/**
 * Prepares all trials of a study from disk.
 *
 * @param study - the study
 * @param baseDir - folder the trial paths are relative to
 * @param onProgress - called after each trial with (done, total)
 * @returns prepared trials and failed trials, in study order
 */
export async function prepareStudyFromDisk(
  study: StudyFile,
  baseDir: string,
  onProgress?: (done: number, total: number) => void,
): Promise<{ prepared: PreparedTrial[]; failed: FailedTrial[] }> {
  const prepared: PreparedTrial[] = [];
  const failed: FailedTrial[] = [];
  let done = 0;
  for (const trial of study.trials) {
    let file = trial.file;
    try {
      const rec = await readRecordingFile(join(baseDir, trial.file));
      let emg;
      if (trial.emgFile) {
        file = trial.emgFile;
        emg = await readRecordingFile(join(baseDir, trial.emgFile));
        file = trial.file;
      }
      prepared.push(prepareTrial(trial, rec, study.settings, emg));
    } catch (err) {
      const e = serializeError(err);
      failed.push({ trial, file, code: e.code, reason: e.message });
    }
    onProgress?.(++done, study.trials.length);
  }
  return { prepared, failed };
}
