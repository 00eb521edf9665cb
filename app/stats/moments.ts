/**
 * Weighted first and second moments of a (model, reference) pair, kept centred so that they can be
 * merged level by level without the cancellation of raw power sums (Σw·m² − (Σw·m)²/Σw loses
 * every digit when the mean is large against the spread).
 *
 * Within one level: two passes (means, then centred sums). Across levels: the pairwise update of
 * Chan, Golub & LeVeque (1979), extended to co-moments (common practice).
 */
export interface PairMoments {
  /** number of cells where both model and reference are valid */
  n: number;
  /** Σw */
  w: number;
  /** weighted means of model, reference */
  mMean: number;
  rMean: number;
  /** centred sums Σw(m−m̄)², Σw(r−r̄)², Σw(m−m̄)(r−r̄), Σw(d−d̄)² with d = m − r */
  smm: number;
  srr: number;
  smr: number;
  sdd: number;
}

export function emptyMoments(): PairMoments {
  return { n: 0, w: 0, mMean: 0, rMean: 0, smm: 0, srr: 0, smr: 0, sdd: 0 };
}

/**
 * Add the moments `b` (whose weights are all multiplied by `scale`) into `into`.
 * Scaling leaves means unchanged and multiplies Σw and every centred sum by `scale`.
 */
export function mergeMoments(into: PairMoments, b: PairMoments, scale = 1): void {
  if (b.n === 0 || b.w === 0 || scale === 0) return;
  const wb = b.w * scale;
  if (into.w === 0) {
    into.n = b.n;
    into.w = wb;
    into.mMean = b.mMean;
    into.rMean = b.rMean;
    into.smm = b.smm * scale;
    into.srr = b.srr * scale;
    into.smr = b.smr * scale;
    into.sdd = b.sdd * scale;
    return;
  }
  const wa = into.w;
  const w = wa + wb;
  const dm = b.mMean - into.mMean;
  const dr = b.rMean - into.rMean;
  const dd = dm - dr;
  const f = (wa * wb) / w;
  into.n += b.n;
  into.w = w;
  into.mMean += (dm * wb) / w;
  into.rMean += (dr * wb) / w;
  into.smm += b.smm * scale + dm * dm * f;
  into.srr += b.srr * scale + dr * dr * f;
  into.smr += b.smr * scale + dm * dr * f;
  into.sdd += b.sdd * scale + dd * dd * f;
}

type Values = ArrayLike<number>;

/**
 * Two-pass weighted moments over the cells where model, reference and weight are all finite
 * (and weight > 0). `cells` restricts the pass to a list of indices (a region); without it every index.
 */
export function pairMoments(model: Values, ref: Values, weight: Values, cells?: Int32Array | null): PairMoments {
  const count = cells ? cells.length : model.length;
  let n = 0;
  let sw = 0;
  let swm = 0;
  let swr = 0;
  for (let q = 0; q < count; q++) {
    const c = cells ? cells[q] : q;
    const m = model[c];
    const r = ref[c];
    const w = weight[c];
    // NaN fails every comparison, so this one test rejects missing values too
    if (m - m === 0 && r - r === 0 && w > 0 && w < Infinity) {
      n++;
      sw += w;
      swm += w * m;
      swr += w * r;
    }
  }
  const out = emptyMoments();
  if (n === 0) return out;
  const mMean = swm / sw;
  const rMean = swr / sw;
  let smm = 0;
  let srr = 0;
  let smr = 0;
  let sdd = 0;
  // second pass: centred sums, plus the residual of the first pass (a cheap correction, as in the
  // corrected two-pass algorithm of Chan, Golub & LeVeque 1983)
  let em = 0;
  let er = 0;
  for (let q = 0; q < count; q++) {
    const c = cells ? cells[q] : q;
    const m = model[c];
    const r = ref[c];
    const w = weight[c];
    if (m - m === 0 && r - r === 0 && w > 0 && w < Infinity) {
      const a = m - mMean;
      const b = r - rMean;
      const d = a - b;
      em += w * a;
      er += w * b;
      smm += w * a * a;
      srr += w * b * b;
      smr += w * a * b;
      sdd += w * d * d;
    }
  }
  out.n = n;
  out.w = sw;
  out.mMean = mMean + em / sw;
  out.rMean = rMean + er / sw;
  out.smm = Math.max(0, smm - (em * em) / sw);
  out.srr = Math.max(0, srr - (er * er) / sw);
  out.smr = smr - (em * er) / sw;
  const ed = em - er;
  out.sdd = Math.max(0, sdd - (ed * ed) / sw);
  return out;
}

/**
 * Two-pass weighted moments for every label of a partition at once (labels[c] in 0..nLabels-1, or −1 for
 * cells in no region): two passes over the level whatever the number of labels. Also sums, per label,
 * the weight of the cells where the reference is valid (for the compared share). Labels come in long runs
 * (a basin is contiguous along a row), so sums are kept in locals and flushed when the label changes.
 */
export function labelledMoments(
  model: Values,
  ref: Values,
  weight: Values,
  labels: Int16Array | Int32Array,
  nLabels: number,
): { moments: PairMoments[]; refWeight: Float64Array } {
  const cnt = new Float64Array(nLabels);
  const sw = new Float64Array(nLabels);
  const swm = new Float64Array(nLabels);
  const swr = new Float64Array(nLabels);
  const refWeight = new Float64Array(nLabels);
  const n = labels.length;
  let cur = -1;
  let c0 = 0, w0 = 0, m0 = 0, r0 = 0, f0 = 0;
  for (let c = 0; c < n; c++) {
    const L = labels[c];
    if (L !== cur) {
      if (cur >= 0) {
        cnt[cur] += c0; sw[cur] += w0; swm[cur] += m0; swr[cur] += r0; refWeight[cur] += f0;
      }
      cur = L;
      c0 = 0; w0 = 0; m0 = 0; r0 = 0; f0 = 0;
    }
    if (L < 0) continue;
    const r = ref[c];
    if (r - r !== 0) continue;
    const w = weight[c];
    if (!(w > 0 && w < Infinity)) continue;
    f0 += w;
    const m = model[c];
    if (m - m !== 0) continue;
    c0++;
    w0 += w;
    m0 += w * m;
    r0 += w * r;
  }
  if (cur >= 0) {
    cnt[cur] += c0; sw[cur] += w0; swm[cur] += m0; swr[cur] += r0; refWeight[cur] += f0;
  }
  const mMean = new Float64Array(nLabels);
  const rMean = new Float64Array(nLabels);
  for (let L = 0; L < nLabels; L++) {
    if (sw[L] > 0) {
      mMean[L] = swm[L] / sw[L];
      rMean[L] = swr[L] / sw[L];
    }
  }
  const em = new Float64Array(nLabels);
  const er = new Float64Array(nLabels);
  const smm = new Float64Array(nLabels);
  const srr = new Float64Array(nLabels);
  const smr = new Float64Array(nLabels);
  const sdd = new Float64Array(nLabels);
  cur = -1;
  let mm = 0, rm = 0, a1 = 0, b1 = 0, aa = 0, bb = 0, ab = 0, dd = 0;
  for (let c = 0; c < n; c++) {
    const L = labels[c];
    if (L !== cur) {
      if (cur >= 0) {
        em[cur] += a1; er[cur] += b1; smm[cur] += aa; srr[cur] += bb; smr[cur] += ab; sdd[cur] += dd;
      }
      cur = L;
      a1 = 0; b1 = 0; aa = 0; bb = 0; ab = 0; dd = 0;
      if (L >= 0) {
        mm = mMean[L];
        rm = rMean[L];
      }
    }
    if (L < 0) continue;
    const m = model[c];
    const r = ref[c];
    const w = weight[c];
    if (m - m === 0 && r - r === 0 && w > 0 && w < Infinity) {
      const a = m - mm;
      const b = r - rm;
      const d = a - b;
      a1 += w * a;
      b1 += w * b;
      aa += w * a * a;
      bb += w * b * b;
      ab += w * a * b;
      dd += w * d * d;
    }
  }
  if (cur >= 0) {
    em[cur] += a1; er[cur] += b1; smm[cur] += aa; srr[cur] += bb; smr[cur] += ab; sdd[cur] += dd;
  }
  const moments: PairMoments[] = [];
  for (let L = 0; L < nLabels; L++) {
    const W = sw[L];
    if (cnt[L] === 0) {
      moments.push(emptyMoments());
      continue;
    }
    const ed = em[L] - er[L];
    moments.push({
      n: cnt[L],
      w: W,
      mMean: mMean[L] + em[L] / W,
      rMean: rMean[L] + er[L] / W,
      smm: Math.max(0, smm[L] - (em[L] * em[L]) / W),
      srr: Math.max(0, srr[L] - (er[L] * er[L]) / W),
      smr: smr[L] - (em[L] * er[L]) / W,
      sdd: Math.max(0, sdd[L] - (ed * ed) / W),
    });
  }
  return { moments, refWeight };
}
