// Exposure, planning, storage and lighting-load computations (issue 4), in one import.
// The code lives in ./exposure/ by concept; this file is the public face other packages use.
export {
  stopsBetween,
  apertureStops,
  ev100,
  shutterAngleToSeconds,
  secondsToShutterAngle,
  ndStops,
  ndDensityForStops,
  ndTransmission,
} from './exposure/math.ts';
export {
  nominalIsoSeries,
  nominalApertureSeries,
  nominalShutterSeries,
  isoThirdsFrom100,
  isoAtThirdsFrom100,
  exactFNumber,
  type NominalShutterSpeed,
} from './exposure/series.ts';
export {
  isoSweepPlan,
  latitudeBracketPlan,
  exposureDifferenceStops,
  HOLD_TOLERANCE_STOPS,
  type PlanSettings,
  type ShotSettings,
  type ResolvedBase,
  type IsoSweepStep,
  type IsoSweepPlan,
  type LatitudeBracketStep,
  type LatitudeBracketPlan,
} from './exposure/plans.ts';
export {
  bytesForBitrate,
  formatBytesBoth,
  uploadSeconds,
  cardRecordingSeconds,
  storageEstimate,
  type StorageEstimate,
} from './exposure/storage.ts';
export {
  circuitLoads,
  lightingLine,
  CONTINUOUS_LOAD_FRACTION,
  ELECTRICAL_SAFETY_NOTE,
  type LightingFixture,
  type LightingCircuit,
  type CircuitLoad,
  type CircuitLoadReport,
} from './exposure/lighting-load.ts';
export {
  formatStops,
  formatFps,
  formatSeconds,
  formatAngle,
  formatFNumber,
  formatDensity,
} from './exposure/format.ts';
export type { StopStep } from './exposure/guards.ts';
