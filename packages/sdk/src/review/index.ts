export { reviewOffsets, configuredFraction, REVIEW_CAUTION } from './check.js';
export type { ReviewOptions } from './check.js';
export { parseReviewInput } from './parse.js';
export type {
  ConfiguredOffset, Diagnosis, DiagnosisCode, DispersionAnalysis, DispersionPercentile, ReviewInput, ReviewLimits, ReviewOrbit,
  ReviewReport, ReviewSpacecraft, SpacecraftFinding, Verdict,
} from './types.js';
