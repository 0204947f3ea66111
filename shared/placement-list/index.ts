export * from './types';
export { fmt3, fmtRot3, fmtShort, csvField, sha256Hex } from './format';
export { writePlacementListCsv, writePlacementListJson, placementListObject, placementCsvBody, placementCsvBodyBytes, transformMetaLine } from './write';
export { readPlacementList, readPlacementListCsv, readPlacementListJson, type ReadOptions } from './read';
