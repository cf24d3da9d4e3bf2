// Public API of the export helpers: the instrument-frame transform and the move-list files.
export { toInstrumentFrame, fromInstrumentFrame, describeConvention, DEFAULT_CONVENTION, type ScanWindow, type FrameConvention, type XY } from './frame'
export { movesToCsv, movesToJson, EXPORT_CAUTION, CSV_COLUMNS, type ExportMove, type ExportRoute } from './moves'
