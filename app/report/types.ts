import type { ComparisonResult } from '../compare/run.js';

/** Where a skill table came from: enough to say what was compared, with what, and by which tool. */
export interface Provenance {
  tool: string;
  version: string;
  /** ISO date and time of the comparison */
  date: string;
  recipe: string | null;
  inputs: ComparisonResult['inputs'];
  options: unknown;
  regions: string[];
  layers: string[];
  variables: ComparisonResult['variables'];
}
