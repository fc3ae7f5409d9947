export type { Layout, LayoutPlate, WellAssignment, WellRole, LayoutDiagnostics, AssociationStat, LayoutOptions } from './types';
export { LayoutError } from './LayoutError';
export { rowLabel, wellName, parseWellName } from './wellName';
export { plateGeometry, wellCentre, edgeDistance, FOOTPRINT, type PlateGeometry } from './plateGeometry';
export { layoutDesign, CONTROL_LABEL } from './layoutDesign';
export { layoutDiagnostics, type LayoutShape } from './layoutDiagnostics';
export { chiSquareIndependence, type ChiSquareResult } from './chiSquareIndependence';
export { kruskalWallis, type KruskalWallisResult } from './kruskalWallis';
