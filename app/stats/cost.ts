/**
 * Multi-tracer cost for ranking runs: Σ over variables of RMSE / |reference mean|, each term taken over
 * the global, full-depth, volume-weighted comparison (a normalised misfit; common practice).
 * A variable whose reference mean is zero or whose RMSE is undefined makes the cost undefined (null).
 */
export interface CostTerm {
  variable: string;
  rmse: number | null;
  refMean: number | null;
}

export function multiTracerCost(terms: CostTerm[]): { cost: number | null; terms: { variable: string; term: number | null }[] } {
  let cost: number | null = terms.length ? 0 : null;
  const parts = terms.map((t) => {
    const term = t.rmse !== null && t.refMean !== null && t.refMean !== 0 ? t.rmse / Math.abs(t.refMean) : null;
    if (term === null) cost = null;
    else if (cost !== null) cost += term;
    return { variable: t.variable, term };
  });
  return { cost, terms: parts };
}
