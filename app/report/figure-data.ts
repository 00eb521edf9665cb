/**
 * What the report's figures need, gathered while the comparison streams the levels (so nothing is read twice):
 * per map layer the reference, each run and each difference as one value per column; per basin the zonal
 * means; per line the sections. Memory: a few arrays of one level per map layer and run, plus the sections
 * (levels × rows or samples). Fed through the comparison's field sinks, which also hand over the reference.
 */
import type { FieldSinkInfo, LevelSink } from '../compare/field-sink.js';
import type { Grid, VerticalAxis } from '../grid/types.js';
import { comparedColumnMeans } from '../lines/column-mean.js';
import { pointWeights } from '../lines/location-weights.js';
import { sampleLine } from '../lines/run-line.js';
import type { SampledLine } from '../lines/sample-path.js';
import { sampleLevel, seafloorOutline } from '../lines/section.js';
import type { SparseWeights } from '../regrid/csr.js';
import { BottomTracker } from '../regions/bottom.js';
import { layerLevelMetres, type LayerSpec } from '../regions/layers.js';
import { zonalMeans } from '../lines/slices.js';

export interface LayerMaps {
  layer: LayerSpec;
  reference: Float32Array;
  runs: { label: string; values: Float32Array; difference: Float32Array }[];
}

export interface ZonalData {
  basin: string;
  lat: Float64Array;
  latEdges: Float64Array;
  reference: Float32Array;
  runs: { label: string; values: Float32Array; difference: Float32Array }[];
}

export interface LineData {
  name: string;
  line: SampledLine;
  reference: Float32Array;
  runs: { label: string; values: Float32Array; difference: Float32Array }[];
  seafloor: Float64Array;
  columnMeans: { label: string; values: Float64Array }[];
}

export interface VariableFigureData {
  variable: string;
  units: string;
  grid: Grid;
  maps: LayerMaps[];
  zonal: ZonalData[];
  lines: LineData[];
}

/** Layer means of a column, accumulated level by level over the valid values. */
class LayerMean {
  readonly sum: Float64Array;
  readonly weight: Float64Array;
  constructor(n: number) {
    this.sum = new Float64Array(n);
    this.weight = new Float64Array(n);
  }
  add(values: Float32Array, w: number, also?: Float32Array): void {
    for (let c = 0; c < values.length; c++) {
      const v = values[c];
      if (v === v && (also === undefined || also[c] === also[c])) {
        this.sum[c] += w * v;
        this.weight[c] += w;
      }
    }
  }
  result(): Float32Array {
    const out = new Float32Array(this.sum.length);
    for (let c = 0; c < out.length; c++) out[c] = this.weight[c] > 0 ? this.sum[c] / this.weight[c] : NaN;
    return out;
  }
}

interface RunParts {
  label: string;
  means: (LayerMean | null)[];
  diffMeans: (LayerMean | null)[];
  bottom: BottomTracker | null;
  ownBottom: Float32Array | null;
  zonal: { values: Float32Array; difference: Float32Array }[];
  lines: Float32Array[];
}

export interface CollectPlan {
  mapLayers: LayerSpec[];
  /** basin name → mask of its cells on the common grid */
  basins: { name: string; mask: Uint8Array }[];
  lines: { name: string; spec: Parameters<typeof sampleLine>[0] }[];
  bottomTolerance: number | null;
}

const ONE_LAYER: VerticalAxis = { nz: 1, centres: Float64Array.of(0), edges: Float64Array.of(0, 1), thickness: Float64Array.of(1), boundsDerived: true };

/** Gathers one variable's figure data; `sinkFor` is handed to the comparison once per run. */
export class VariableCollector {
  private readonly runs: RunParts[] = [];
  private readonly refMeans: (LayerMean | null)[];
  private readonly refBottom: Float32Array | null;
  private readonly refZonal: Float32Array[];
  private readonly refLines: Float32Array[];
  private readonly sampled: { name: string; line: SampledLine; weights: SparseWeights }[];
  private readonly metres: Float64Array[];
  private readonly axis: VerticalAxis;
  private readonly ncell: number;
  private readonly ny: number;
  private readonly nx: number;

  constructor(readonly variable: string, readonly units: string, readonly grid: Grid, private readonly plan: CollectPlan) {
    this.axis = grid.vertical ?? ONE_LAYER;
    const h = grid.horizontal;
    this.nx = h.nx;
    this.ny = h.ny;
    this.ncell = h.nx * h.ny;
    this.metres = plan.mapLayers.map((l) => layerLevelMetres(l.kind === 'bottom' ? { kind: 'all' } : l, this.axis));
    this.refMeans = plan.mapLayers.map((l) => (l.kind === 'bottom' ? null : new LayerMean(this.ncell)));
    this.refBottom = plan.mapLayers.some((l) => l.kind === 'bottom') ? new Float32Array(this.ncell).fill(NaN) : null;
    const rect = h.kind === 'rectilinear' && h.axes && grid.vertical;
    this.refZonal = rect ? plan.basins.map(() => new Float32Array(this.axis.nz * this.ny).fill(NaN)) : [];
    this.sampled = grid.vertical
      ? plan.lines.map((l) => {
          const line = sampleLine(l.spec);
          return { name: l.name, line, weights: pointWeights(h, line.lon, line.lat, 'bilinear') };
        })
      : [];
    this.refLines = this.sampled.map((s) => new Float32Array(this.axis.nz * s.line.lon.length).fill(NaN));
  }

  sinkFor(info: FieldSinkInfo): LevelSink {
    const q = this.runs.length;
    const hasBottom = this.refBottom !== null;
    const parts: RunParts = {
      label: info.run,
      means: this.plan.mapLayers.map((l) => (l.kind === 'bottom' ? null : new LayerMean(this.ncell))),
      diffMeans: this.plan.mapLayers.map((l) => (l.kind === 'bottom' ? null : new LayerMean(this.ncell))),
      bottom: hasBottom ? new BottomTracker(this.ncell) : null,
      ownBottom: hasBottom ? new Float32Array(this.ncell).fill(NaN) : null,
      zonal: this.refZonal.map(() => ({ values: new Float32Array(this.axis.nz * this.ny), difference: new Float32Array(this.axis.nz * this.ny) })),
      lines: this.sampled.map((s) => new Float32Array(this.axis.nz * s.line.lon.length)),
    };
    this.runs.push(parts);
    return {
      write: async (k, model, difference, reference) => {
        if (!reference) throw new Error('the report needs the reference level beside each run level');
        if (q === 0) this.addReference(k, reference);
        this.plan.mapLayers.forEach((l, i) => {
          const w = this.metres[i][k];
          if (l.kind !== 'bottom' && w > 0) {
            parts.means[i]!.add(model, w);
            parts.diffMeans[i]!.add(difference, w);
          }
        });
        if (parts.bottom) {
          parts.bottom.update(k, model, reference);
          const own = parts.ownBottom!;
          for (let c = 0; c < model.length; c++) if (model[c] === model[c]) own[c] = model[c];
        }
        if (this.refZonal.length) {
          const h = this.grid.horizontal;
          this.plan.basins.forEach((b, i) => {
            const z = zonalMeans([model], [reference], h.area, b.mask, this.nx, this.ny);
            parts.zonal[i].values.set(z.model, k * this.ny);
            parts.zonal[i].difference.set(z.difference, k * this.ny);
          });
        }
        this.sampled.forEach((s, i) => {
          const n = s.line.lon.length;
          sampleLevel(s.weights, model, parts.lines[i].subarray(k * n, (k + 1) * n));
        });
      },
      close: async () => undefined,
      abort: async () => undefined,
    };
  }

  private addReference(k: number, reference: Float32Array): void {
    this.plan.mapLayers.forEach((l, i) => {
      const w = this.metres[i][k];
      if (l.kind !== 'bottom' && w > 0) this.refMeans[i]!.add(reference, w);
    });
    if (this.refBottom) for (let c = 0; c < reference.length; c++) if (reference[c] === reference[c]) this.refBottom[c] = reference[c];
    if (this.refZonal.length) {
      const h = this.grid.horizontal;
      this.plan.basins.forEach((b, i) => this.refZonal[i].set(zonalMeans([reference], [reference], h.area, b.mask, this.nx, this.ny).reference, k * this.ny));
    }
    this.sampled.forEach((s, i) => {
      const n = s.line.lon.length;
      sampleLevel(s.weights, reference, this.refLines[i].subarray(k * n, (k + 1) * n));
    });
  }

  result(): VariableFigureData {
    const maps: LayerMaps[] = this.plan.mapLayers.map((layer, i) => {
      if (layer.kind === 'bottom') {
        return {
          layer,
          reference: this.refBottom!,
          runs: this.runs.map((r) => {
            const sel = r.bottom!.select(this.axis.centres, this.plan.bottomTolerance);
            const d = new Float32Array(this.ncell);
            for (let c = 0; c < d.length; c++) d[c] = sel.model[c] - sel.ref[c];
            return { label: r.label, values: r.ownBottom!, difference: d };
          }),
        };
      }
      return { layer, reference: this.refMeans[i]!.result(), runs: this.runs.map((r) => ({ label: r.label, values: r.means[i]!.result(), difference: r.diffMeans[i]!.result() })) };
    });
    const h = this.grid.horizontal;
    const zonal: ZonalData[] = this.refZonal.map((ref, i) => ({
      basin: this.plan.basins[i].name,
      lat: h.axes!.lat,
      latEdges: h.axes!.latEdges,
      reference: ref,
      runs: this.runs.map((r) => ({ label: r.label, values: r.zonal[i].values, difference: r.zonal[i].difference })),
    }));
    const lines: LineData[] = this.sampled.map((s, i) => {
      const n = s.line.lon.length;
      const ref = this.refLines[i];
      const runs = this.runs.map((r) => {
        const d = new Float32Array(ref.length);
        for (let c = 0; c < d.length; c++) d[c] = r.lines[i][c] - ref[c];
        return { label: r.label, values: r.lines[i], difference: d };
      });
      return {
        name: s.name,
        line: s.line,
        reference: ref,
        runs,
        seafloor: seafloorOutline(ref, n, this.axis),
        // compared means: over the cells where the reference and every run have values (COMPARED_CELLS)
        columnMeans: ((m) => [{ label: 'reference', values: m[0] }, ...runs.map((r, f) => ({ label: r.label, values: m[f + 1] }))])(
          comparedColumnMeans([ref, ...runs.map((r) => r.values)], n, this.axis).means,
        ),
      };
    });
    return { variable: this.variable, units: this.units, grid: this.grid, maps, zonal, lines };
  }
}
