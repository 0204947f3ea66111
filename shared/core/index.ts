// The bottom layer of the engine: the result types, the input error and the record helpers that
// every engine module uses. Imports nothing from the other modules (see ../README.md).
export { EngineInputError, type EngineInputErrorFields } from './errors';
export { parseWith, issuePath } from './parse-input';
export { placementRecord, placementRecords, allocatePlacementColumns, defineLazyColumns, filledArray, type RepeatedColumn } from './records';
export type * from './types';
export { fixed, fixed3, lengthText, angleText, byteSizeText } from './format';
export { ENGINE_VERSION } from './version';
