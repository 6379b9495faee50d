import type { ModelChoice } from '../lib/stats/analyze-measured';
import { MODEL_NAMES } from '../lib/stats/models/fitted-model';

/**
 * Every model `analyze` accepts: the engine's list of models (the order model-search.ts tries them in), plus
 * automatic choice and the quantile method. Apart from the command so that the usage text can name them without
 * loading the analysis.
 */
export const MODELS: readonly ModelChoice[] = ['auto', ...MODEL_NAMES, 'quantile'];
