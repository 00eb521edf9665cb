/** skill.json: rows (DESIGN.md section 3) plus run costs, seasonal-cycle rows (when asked for) and provenance. Undefined numbers are null. */
import type { ComparisonResult } from '../compare/run.js';
import type { Provenance } from './types.js';

export function skillJson(result: ComparisonResult, provenance: Provenance): string {
  return JSON.stringify({ provenance, costs: result.costs, rows: result.rows, ...(result.cycles ? { cycles: result.cycles } : {}) }, null, 1) + '\n';
}
