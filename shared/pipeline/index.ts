// The engine's public entry: one job run, the result types, errors and record helpers.
export { runJob, type RunJobInput } from './run-job';
export { EngineInputError, type EngineInputErrorFields } from './errors';
export { parseWith, issuePath } from './parse-input';
export { placementRecord, placementRecords, allocatePlacementColumns, defineLazyColumns, filledArray } from './records';
export type * from './types';
