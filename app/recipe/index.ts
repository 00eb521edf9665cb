export { loadRecipe } from './load.js';
export { validateRecipe, layerFromEntry, type ValidateOptions } from './validate.js';
export { recipeToJson } from './to-json.js';
export { recipeSchema, type RecipeInput, type ParsedRecipe, type RecipeOptions } from './schema.js';
export type { Recipe, SourceSpec, VariableSource, ResolvedRegion } from './types.js';
