/**
 * The colour scales a person can choose, under names of our own. Besides the two tables of colour-scales.ts,
 * scales are built in the Oklab colour space (Ottosson 2020) with lightness running in equal steps, so that
 * equal steps of value look like equal steps of colour (perceptually uniform): sequential scales from dark to
 * light, diverging ones light in the middle and equally dark at both ends.
 */
import { DIVERGING, SEQUENTIAL, lightness, type ColourScale, type ScaleKind } from './colour-scales.js';
import { packRgba } from './recolour.js';

/** Oklab to linear sRGB (Ottosson 2020, "A perceptual color space for image processing"; matrices from memory). */
export function oklabToLinearSrgb(L: number, a: number, b: number): [number, number, number] {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s,
  ];
}

/** Linear light to an 8-bit sRGB code (IEC 61966-2-1 transfer function). */
function encode(c: number): number {
  const v = c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055;
  return Math.round(Math.min(1, Math.max(0, v)) * 255);
}

/** An sRGB colour of lightness L, chroma C and hue h (degrees): chroma is reduced until the colour is displayable. */
function fromLch(L: number, C: number, hDeg: number): [number, number, number] {
  const h = (hDeg * Math.PI) / 180;
  let c = C;
  for (let i = 0; i < 40; i++) {
    const rgb = oklabToLinearSrgb(L, c * Math.cos(h), c * Math.sin(h));
    if (rgb.every((v) => v >= -1e-4 && v <= 1 + 1e-4)) return [encode(rgb[0]), encode(rgb[1]), encode(rgb[2])];
    c *= 0.9;
  }
  const g = oklabToLinearSrgb(L, 0, 0);
  return [encode(g[0]), encode(g[1]), encode(g[2])];
}

interface Anchor {
  /** Oklab lightness 0..1 */
  L: number;
  C: number;
  /** hue, degrees */
  h: number;
}

const ENTRIES = 256;

/** A colour along the anchors at fraction t (0..1): lightness, chroma and hue interpolated linearly between them. */
function along(anchors: Anchor[], t01: number): [number, number, number] {
  const t = t01 * (anchors.length - 1);
  const i = Math.min(anchors.length - 2, Math.floor(t));
  const f = t - i;
  const a = anchors[i];
  const b = anchors[i + 1];
  // a grey anchor has no hue of its own: the hue of its neighbour is kept across the segment
  const h0 = a.C === 0 ? b.h : a.h;
  const h1 = b.C === 0 ? a.h : b.h;
  return fromLch(a.L + f * (b.L - a.L), a.C + f * (b.C - a.C), h0 + f * (h1 - h0));
}

/**
 * A scale through anchors. A sequential scale is then re-spaced so that CIE L* (lightness(), CIE 1976) rises in
 * equal steps: Oklab's lightness and the gamut limit bend it otherwise.
 */
function fromAnchors(kind: ScaleKind, name: string, anchors: Anchor[]): ColourScale {
  const rgb = new Uint8Array(ENTRIES * 3);
  const packed = new Uint32Array(ENTRIES);
  const FINE = 2048;
  const fine: [number, number, number][] = [];
  const fineL: number[] = [];
  for (let q = 0; q < FINE; q++) {
    fine.push(along(anchors, q / (FINE - 1)));
    fineL.push(lightness(...fine[q]));
  }
  let q = 0;
  for (let k = 0; k < ENTRIES; k++) {
    let c: [number, number, number];
    if (kind === 'sequential') {
      const target = fineL[0] + (k / (ENTRIES - 1)) * (fineL[FINE - 1] - fineL[0]);
      while (q < FINE - 1 && fineL[q + 1] <= target) q++;
      c = fine[q];
    } else c = fine[Math.round((k / (ENTRIES - 1)) * (FINE - 1))];
    rgb.set(c, k * 3);
    packed[k] = packRgba(c[0], c[1], c[2]);
  }
  return { kind, name, rgb, packed };
}

export interface NamedScale {
  id: string;
  label: string;
  scale: ColourScale;
}

export const FIELD_SCALES: readonly NamedScale[] = [
  { id: 'lagoon', label: 'Lagoon (blue–green–yellow)', scale: { ...SEQUENTIAL, name: 'lagoon' } },
  { id: 'ember', label: 'Ember (purple–red–yellow)', scale: fromAnchors('sequential', 'ember', [{ L: 0.22, C: 0.09, h: 300 }, { L: 0.55, C: 0.2, h: 20 }, { L: 0.95, C: 0.12, h: 100 }]) },
  { id: 'kelp', label: 'Kelp (dark green–pale yellow)', scale: fromAnchors('sequential', 'kelp', [{ L: 0.22, C: 0.05, h: 200 }, { L: 0.6, C: 0.12, h: 150 }, { L: 0.96, C: 0.07, h: 105 }]) },
  { id: 'slate', label: 'Slate (greys)', scale: fromAnchors('sequential', 'slate', [{ L: 0.2, C: 0, h: 0 }, { L: 0.97, C: 0, h: 0 }]) },
];

export const DIFF_SCALES: readonly NamedScale[] = [
  { id: 'tide', label: 'Tide (blue–white–red)', scale: { ...DIVERGING, name: 'tide' } },
  {
    id: 'estuary',
    label: 'Estuary (teal–white–brown)',
    scale: fromAnchors('diverging', 'estuary', [{ L: 0.38, C: 0.08, h: 195 }, { L: 0.97, C: 0, h: 0 }, { L: 0.38, C: 0.08, h: 70 }]),
  },
  {
    id: 'heath',
    label: 'Heath (violet–white–green)',
    scale: fromAnchors('diverging', 'heath', [{ L: 0.38, C: 0.12, h: 305 }, { L: 0.97, C: 0, h: 0 }, { L: 0.38, C: 0.1, h: 145 }]),
  },
];

export const DEFAULT_FIELD_SCALE = 'lagoon';
export const DEFAULT_DIFF_SCALE = 'tide';

/** The scale of this id among `choices`, or the first (an unknown name from an old recipe falls back quietly). */
export function namedScale(choices: readonly NamedScale[], id: string): ColourScale {
  return (choices.find((c) => c.id === id) ?? choices[0]).scale;
}
