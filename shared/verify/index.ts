// The findings engine: public surface. Pure (no node: imports): safe in a worker thread, the CLI
// and the browser. See README.md in this folder.
export { verify, verifyBruteForce, validateInput, VerifyInputError, SHADOW_HEIGHT_STEP, DEFAULT_LIMIT } from './verify';
export { verifyInputFromRuns } from './from-job';
export { findingKey, fmtMm } from './report';
export { compareRefs, compareBoardRefs, boardRef, sortRefsNatural } from './natural';
export { TOUCH_EPS, TOUCH_EPS_AREA } from './geom';
export { makeVerifyInput, rectQuad, type PartSpec, type LayoutSpec } from './build';
export { releaseVerifyScratch } from './scratch';
export type { VerifyTask } from './task';
export * from './types';
