export type { ReviewOptions } from './check.js';
export { configuredFraction, REVIEW_CAUTION, reviewOffsets } from './check.js';
export { parseReviewInput } from './parse.js';
export type {
  ConfiguredOffset,
  Diagnosis,
  DiagnosisCode,
  DispersionAnalysis,
  DispersionPercentile,
  ReviewInput,
  ReviewLimits,
  ReviewOrbit,
  ReviewReport,
  ReviewSpacecraft,
  SpacecraftFinding,
  Verdict,
} from './types.js';
