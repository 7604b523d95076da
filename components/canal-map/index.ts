export { CanalMap, CONVENTION_LABEL, orientationWords, type CanalMapProps } from "./canal-map";
export { MapLegend } from "./map-legend";
export { LesionShape, lesionAccessibleName, type MapLesion, type LesionSaveState } from "./lesion-shape";
export { type GhostLesion } from "./ghost-shape";
export { TreatedRing, type TreatedArc } from "./treated-ring";
export { GRADE_ENCODING, ZONE_ENCODING, ORIENTATION_NOTE, TREATED_RING } from "./encoding";
export * from "./map-geometry";
export { clientToSvg } from "./pointer";
