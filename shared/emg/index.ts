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
