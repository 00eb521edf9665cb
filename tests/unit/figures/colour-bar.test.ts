import { describe, expect, it } from 'vitest';
import { barTicks, colourBarH, colourBarV } from '../../../app/figures/colour-bar.js';
import { el, type SvgNode } from '../../../app/figures/svg-tree.js';
import { SEQUENTIAL } from '../../../app/render/colour-scales.js';

const texts = (g: SvgNode): string[] => [...g.walk()].filter((n) => n.tag === 'text').map((n) => n.textContent());
const classes = (g: SvgNode): string[] => [...g.walk()].map((n) => n.getAttribute('class') ?? '').filter(Boolean);

describe('colour bars', () => {
  it('a logarithmic bar puts each decade an equal length apart (exact: log10 10 = 1, log10 100 = 2)', () => {
    const t = barTicks(1, 1000, { log: true });
    const at = (v: number) => t.find((x) => x.value === v)?.at;
    expect(at(1)).toBeCloseTo(0, 12);
    expect(at(10)).toBeCloseTo(1 / 3, 12);
    expect(at(100)).toBeCloseTo(2 / 3, 12);
    expect(at(1000)).toBeCloseTo(1, 12);
    // 2 and 5 × 10^k between decades (common practice for log axes)
    expect(at(2)).toBeCloseTo(Math.log10(2) / 3, 12);
  });

  it('a linear bar places a tick by its value (0 at min, 1 at max) and writes negatives with a true minus', () => {
    const t = barTicks(-2, 2, {});
    expect(t.find((x) => x.label === '0')?.at).toBeCloseTo(0.5, 12);
    expect(t.some((x) => x.label === '−2')).toBe(true);
  });

  it('draws arrows only at the ends where values are clipped, and says when the stretch is logarithmic', () => {
    const g = el('g');
    colourBarV(g, { x: 0, y: 0, w: 6, h: 100 }, SEQUENTIAL, 0.1, 10, 'Phosphate (µmol kg⁻¹)', { log: true, above: true });
    expect(classes(g)).toContain('clip-above');
    expect(classes(g)).not.toContain('clip-below');
    expect(texts(g)).toContain('Phosphate (µmol kg⁻¹), log scale');
    const h = el('g');
    colourBarH(h, { x: 0, y: 0, w: 100, h: 5 }, SEQUENTIAL, 0, 30, 'Temperature (°C)', { below: true });
    expect(classes(h)).toContain('clip-below');
    expect(classes(h)).not.toContain('clip-above');
    expect(texts(h)).toContain('Temperature (°C)');
  });
});
