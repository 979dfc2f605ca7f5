/**
 * `@keelson/scoring`: the register score of spec section 7 (impact band, likelihood, rating and
 * its band) with the settings an admin edits. Pure: runs in the API, the worker and the browser.
 */
export { fewestAlternativesBySupplier } from './alternatives';
export {
  RATING_BANDS,
  SCORING_DEFAULTS,
  impactBandOf,
  likelihoodOf,
  ratingBandOf,
  registerScore,
  scoringSettingsSchema,
  type LikelihoodInputs,
  type LikelihoodResult,
  type LikelihoodWeights,
  type RatingBand,
  type RegisterScore,
  type ScoringSettings,
} from './register-score';
