/** skill.json: rows (DESIGN.md section 3) plus run costs and provenance. Undefined numbers are null. */
import type { ComparisonResult } from '../compare/run.js';
import type { Provenance } from './types.js';

export function skillJson(result: ComparisonResult, provenance: Provenance): string {
  return JSON.stringify({ provenance, costs: result.costs, rows: result.rows }, null, 1) + '\n';
}
