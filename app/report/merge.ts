/**
 * Merging skill tables written by separate `compare` jobs (one recipe per job on a cluster) into one table.
 * Rows and seasonal-cycle rows are concatenated; a run's cost is recombined from its per-variable terms. The
 * same run × variable × region × layer × period in two inputs is refused: the tables would disagree on which
 * to keep. A row without a period (a table written before periods existed) is an annual row.
 */
import { readFile } from 'node:fs/promises';
import { z } from 'zod';
import type { ComparisonResult, RunCost } from '../compare/run.js';
import type { CycleRow, SkillRow } from '../compare/rows.js';
import { StillwaterError } from '../errors.js';
import type { Provenance } from './types.js';

const skillDocument = z.object({
  provenance: z.object({ inputs: z.array(z.object({ path: z.string(), size: z.number(), mtime: z.string() })).default([]) }).passthrough(),
  costs: z.array(z.object({ run: z.string(), cost: z.number().nullable(), terms: z.array(z.object({ variable: z.string(), term: z.number().nullable() })) })),
  rows: z.array(z.object({ run: z.string(), variable: z.string(), region: z.string(), layer: z.string(), period: z.string().default('annual') }).passthrough()),
  cycles: z.array(z.object({ run: z.string(), variable: z.string(), region: z.string(), layer: z.string() }).passthrough()).optional(),
});
type SkillDocument = z.infer<typeof skillDocument>;

export async function readSkillJson(path: string): Promise<SkillDocument> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch {
    throw new StillwaterError('E_FILE', `${path}: no such file.`, { file: path });
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch {
    throw new StillwaterError('E_FORMAT', `${path}: is not JSON.`, { file: path });
  }
  const parsed = skillDocument.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const where = issue.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('').replace(/^\./, '');
    throw new StillwaterError('E_FORMAT', `${path}: not a skill.json written by stillwater compare (${where || 'top level'}: ${issue.message}).`, { file: path });
  }
  return parsed.data;
}

export function mergeSkillDocuments(docs: { path: string; doc: SkillDocument }[]): { result: ComparisonResult; mergedFrom: string[] } {
  const seen = new Map<string, string>();
  const rows: SkillRow[] = [];
  const cycles: CycleRow[] = [];
  const seenCycles = new Map<string, string>();
  let anyCycles = false;
  const terms = new Map<string, Map<string, number | null>>();
  const inputs = new Map<string, { path: string; size: number; mtime: string }>();
  const variables = new Map<string, ComparisonResult['variables'][number]>();
  for (const { path, doc } of docs) {
    for (const row of doc.rows) {
      const key = `${row.run} | ${row.variable} | ${row.region} | ${row.layer}${row.period === 'annual' ? '' : ` | ${row.period}`}`;
      const first = seen.get(key);
      if (first !== undefined) {
        throw new StillwaterError('E_INPUT', `${path}: the row ${key} is also in ${first}; merge tables of different runs or variables.`, { file: path });
      }
      seen.set(key, path);
      rows.push(row as unknown as SkillRow);
    }
    for (const c of doc.cycles ?? []) {
      anyCycles = true;
      const key = `${c.run} | ${c.variable} | ${c.region} | ${c.layer}`;
      const first = seenCycles.get(key);
      if (first !== undefined) {
        throw new StillwaterError('E_INPUT', `${path}: the seasonal-cycle row ${key} is also in ${first}; merge tables of different runs or variables.`, { file: path });
      }
      seenCycles.set(key, path);
      cycles.push(c as unknown as CycleRow);
    }
    for (const cost of doc.costs) {
      const byVariable = terms.get(cost.run) ?? new Map<string, number | null>();
      for (const t of cost.terms) byVariable.set(t.variable, t.term);
      terms.set(cost.run, byVariable);
    }
    for (const input of doc.provenance.inputs) inputs.set(input.path, input);
    const vars = (doc.provenance as { variables?: ComparisonResult['variables'] }).variables ?? [];
    for (const v of vars) if (!variables.has(v.variable)) variables.set(v.variable, v);
  }
  const costs: RunCost[] = [...terms].map(([run, byVariable]) => {
    const list = [...byVariable].map(([variable, term]) => ({ variable, term }));
    const cost = list.every((t) => t.term !== null) ? list.reduce((s, t) => s + (t.term as number), 0) : null;
    return { run, cost, terms: list };
  });
  return {
    result: { rows, ...(anyCycles ? { cycles } : {}), costs, variables: [...variables.values()], inputs: [...inputs.values()] },
    mergedFrom: docs.map((d) => d.path),
  };
}

export function mergedProvenance(result: ComparisonResult, mergedFrom: string[], version: string): Provenance & { merged_from: string[] } {
  return {
    tool: 'stillwater',
    version,
    date: new Date().toISOString(),
    recipe: null,
    inputs: result.inputs,
    options: null,
    regions: [...new Set(result.rows.map((r) => r.region))],
    layers: [...new Set(result.rows.map((r) => r.layer))],
    variables: result.variables,
    merged_from: mergedFrom,
  };
}
