/**
 * Forecatch EMG: conditioning filters, onset detectors and the onset review journal.
 */
export * from './complexZpk';
export * from './butterworthZpk';
export * from './zpkToSos';
export * from './butterworthSos';
export * from './sosFilt';
export * from './sosFiltFilt';
export * from './iirNotch';
export { checkSos } from './sosKernel';
export * from './removeOffset';
export * from './rectify';
export * from './movingRms';
export * from './tkeo';
export * from './fillGaps';
export * from './emgConditioningSettings';
export * from './conditionEmg';
export * from './onsetTypes';
export * from './onsetSettings';
export * from './onsetContext';
export * from './onsetStatistics';
export * from './onsetQuality';
export * from './arWhiten';
export * from './thresholdOnStatistic';
export * from './baselineThresholdOnset';
export * from './doubleThresholdOnset';
export * from './tkeoThresholdOnset';
export * from './changePointOnset';
export * from './detectOnset';
export * from './describeOnsetMethod';
export * from './onsetJournal';
export * from './onsetJournalJson';
