/**
 * Recording import and export: one entry point (`readRecording`), the format readers and writers,
 * import templates, alignment of recordings from separate files, and the inspect summary.
 */
export { readRecording, type ReadRecordingOptions } from './readRecording';
export { detectRecordingFormat, type RecordingFileKind } from './detectRecordingFormat';
export { alignRecordings, type AlignHow } from './alignRecordings';
export { summarizeRecording, type RecordingSummary } from './summarizeRecording';
export {
  validateImportTemplate,
  serializeImportTemplate,
  parseImportTemplate,
  type ImportTemplate,
  type ColumnRef,
  type MarkerUnits,
  type TemplateChannel,
  type TemplateMarker,
  type TemplateTime,
} from './importTemplate';
export { createDelimitedReader, type DelimitedReader, type DelimitedReaderOptions } from './delimited/createDelimitedReader';
export { writeDelimitedMarkers, writeDelimitedSignals, type DelimitedWriteOptions } from './delimited/writeDelimited';
export { readEdf, edfPhysicalValue } from './edf/readEdf';
export { readEdfHeader, type EdfHeader, type EdfSignalHeader } from './edf/readEdfHeader';
export { writeEdf, type WriteEdfOptions } from './edf/writeEdf';
