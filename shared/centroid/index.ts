export { importCentroid, importCentroidCollecting, placementsToTable, tableToPlacements, type ImportOptions, type CollectedImport } from './import';
export { analyseHeader, FIELDS, REQUIRED_FIELDS, isField, type Field, type HeaderInfo } from './headers';
export { parseNumberCell, parseRotationCell, parseSideCell, parseFlagCell } from './values';
