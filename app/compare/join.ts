/**
 * The comparison of a whole recipe from the comparisons of its variables one by one (each the recipe with
 * `variables: [v]`): runComparison handles variables one after another and independently, so the rows, cycles,
 * notes and inputs are those of the parts in the recipe's order, and each run's multi-tracer cost is the sum of
 * its terms in that order, as multiTracerCost adds them. The workbench computes a variable's rows first (the one
 * on screen) and joins them for "every variable" without computing anything twice.
 */
import type { ComparisonResult, InputFile, RunCost } from './run.js';

export function joinComparisons(runs: string[], parts: ComparisonResult[]): ComparisonResult {
  const inputs = new Map<string, InputFile>();
  for (const p of parts) for (const f of p.inputs) if (!inputs.has(f.path)) inputs.set(f.path, f);
  const costs: RunCost[] = runs.map((run, i) => {
    const terms = parts.flatMap((p) => p.costs[i]?.terms ?? []);
    let cost: number | null = terms.length ? 0 : null;
    for (const t of terms) {
      if (t.term === null) cost = null;
      else if (cost !== null) cost += t.term;
    }
    return { run, cost, terms };
  });
  const monthly = parts.some((p) => p.cycles);
  return {
    rows: parts.flatMap((p) => p.rows),
    ...(monthly ? { cycles: parts.flatMap((p) => p.cycles ?? []) } : {}),
    costs,
    variables: parts.flatMap((p) => p.variables),
    inputs: [...inputs.values()],
  };
}
