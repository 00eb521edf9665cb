/**
 * Figures as a plain tree of SVG elements, built without a DOM and serialised to text. The shape mirrors the
 * few DOM calls figure code needs (append, setAttribute), so the same figure code serves the screen (which
 * inserts the text) and the exports (which write it).
 */

export type AttrValue = string | number;
export type Child = SvgNode | string;

export class SvgNode {
  readonly attrs = new Map<string, string>();
  readonly children: Child[] = [];

  constructor(readonly tag: string, attrs: Record<string, AttrValue | undefined> = {}) {
    for (const [k, v] of Object.entries(attrs)) if (v !== undefined && v !== '') this.attrs.set(k, String(v));
  }

  append(...children: Child[]): this {
    for (const c of children) this.children.push(c);
    return this;
  }

  setAttribute(name: string, value: AttrValue): void {
    this.attrs.set(name, String(value));
  }

  getAttribute(name: string): string | null {
    return this.attrs.get(name) ?? null;
  }

  /** every element below (and including) this one, depth first */
  *walk(): Generator<SvgNode> {
    yield this;
    for (const c of this.children) if (typeof c !== 'string') yield* c.walk();
  }

  /** the text inside, concatenated */
  textContent(): string {
    return this.children.map((c) => (typeof c === 'string' ? c : c.textContent())).join('');
  }
}

/** An element with attributes and children (text children are escaped when serialised). */
export function el(tag: string, attrs: Record<string, AttrValue | undefined> = {}, ...children: Child[]): SvgNode {
  return new SvgNode(tag, attrs).append(...children);
}

const TEXT_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;' };

export function escapeXml(s: string): string {
  return s.replace(/[&<>"]/g, (c) => TEXT_ESCAPES[c]);
}

/** XML text of a tree (no declaration; callers add one for standalone files). */
export function serialise(node: SvgNode): string {
  const parts: string[] = [];
  const write = (n: SvgNode): void => {
    parts.push('<', n.tag);
    for (const [k, v] of n.attrs) parts.push(' ', k, '="', escapeXml(v), '"');
    if (n.children.length === 0) {
      parts.push('/>');
      return;
    }
    parts.push('>');
    for (const c of n.children) {
      if (typeof c === 'string') parts.push(escapeXml(c));
      else write(c);
    }
    parts.push('</', n.tag, '>');
  };
  write(node);
  return parts.join('');
}
