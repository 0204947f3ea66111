// Pure geometry for the canvas overlay (src/features/canvas): view transform, batch body
// geometry, hit testing, underlay alignment. No React, no Konva, no DOM.
export * from './view';
export * from './bodies';
export * from './hit';
export * from './underlay';
