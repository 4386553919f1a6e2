/**
 * Writes the analysis outputs of a study into a folder: trials.csv, models.csv, methods.txt and, on request,
 * evaluation.json (typed arrays as plain arrays). Each file is written atomically.
 */
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { atomicWriteFile } from './atomicWrite';
import { trialsCsv } from '../../shared/analysis/trialsCsv';
import { modelsCsv } from '../../shared/analysis/modelsCsv';
import { methodsText } from '../../shared/analysis/methodsText';
import type { StudyEvaluation, StudySettings } from '../../shared/analysis/types';

/**
 * JSON text of an evaluation: typed arrays become arrays, non-finite numbers become null.
 *
 * @param evaluation - the evaluation
 * @returns JSON text
 */
export function evaluationJson(evaluation: StudyEvaluation): string {
  return JSON.stringify(
    evaluation,
    (_k, v: unknown) => {
      if (ArrayBuffer.isView(v) && !(v instanceof DataView)) return Array.from(v as unknown as ArrayLike<number>, (x) => (Number.isFinite(x) ? x : null));
      if (typeof v === 'number' && !Number.isFinite(v)) return null;
      return v;
    },
    1,
  );
}

/**
 * Writes the outputs.
 *
 * @param dir - output folder (created when missing)
 * @param evaluation - the study evaluation
 * @param settings - settings used
 * @param withJson - also write evaluation.json
 * @returns the paths written
 */
export async function writeStudyOutputs(dir: string, evaluation: StudyEvaluation, settings: StudySettings, withJson: boolean): Promise<string[]> {
  await mkdir(dir, { recursive: true });
  const files: [string, string][] = [
    ['trials.csv', trialsCsv(evaluation)],
    ['models.csv', modelsCsv(evaluation)],
    ['methods.txt', methodsText(evaluation, settings)],
  ];
  if (withJson) files.push(['evaluation.json', evaluationJson(evaluation)]);
  const out: string[] = [];
  for (const [name, text] of files) {
    const p = join(dir, name);
    await atomicWriteFile(p, text, { keepBackup: false });
    out.push(p);
  }
  return out;
}
