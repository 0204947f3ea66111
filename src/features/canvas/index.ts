// The canvas overlay: the panel to scale, linked to the placement and findings tables.
export { PanelCanvas, type PanelCanvasProps, type DrawStats } from './components/panel-canvas';
export { PanelReview, type PanelReviewProps } from './components/panel-review';
export { PlacementTable } from './components/placement-table';
export { FindingsTable } from './components/findings-table';
export { LayerToggles } from './components/layer-toggles';
export { CanvasStore, useCanvasState, LAYERS, DEFAULT_LAYERS, type LayerId, type CanvasState, type Tool } from './store';
export { buildScene, dimMask, type Scene } from './scene';
export type { CanvasNote, NewNote, UnderlayState } from './types';
export { ReviewSummary, unresolvedErrors, type ReviewSummaryProps } from './components/review-summary';
