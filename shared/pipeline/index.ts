// One side of one panel: import → panel → fiducials → library → output-frame placements
// (runJob), and a run over JSON. The revision as a whole (both sides and the checks) is run by
// ../engine, which everything outside shared/ calls.
export { runJob, type RunJobInput } from './run-job';
export { runResultToJson, runResultFromJson, type RunResultJson, type PlacementColumnsJson } from './serialize';
