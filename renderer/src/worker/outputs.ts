// TEMPORARY until shared/analysis output writers land
import type { StudyEvaluation, StudySettings } from '../../../shared/analysis/types';
export function trialsCsv(e: StudyEvaluation): string { void e; throw new Error('trialsCsv not available yet'); }
export function modelsCsv(e: StudyEvaluation): string { void e; throw new Error('modelsCsv not available yet'); }
export function methodsText(e: StudyEvaluation, s: StudySettings): string { void e; void s; throw new Error('methodsText not available yet'); }
