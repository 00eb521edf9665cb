import { StillwaterError } from '../errors.js';
import { aouLevel, oxygenSaturationLevel } from './aou.js';
import { nStarLevel } from './nstar.js';

/**
 * Derived-tracer expressions, a small language of our own: numbers, variable names, + − * / ^,
 * unary minus, parentheses, the functions abs, exp, log, log10, min, max and the ocean functions
 * oxygen_saturation, aou, nstar, nstar_simple (see OCEAN_FUNCTIONS). Text is tokenised and
 * parsed by recursive descent into a tree, then evaluated element by element over typed arrays
 * (NaN propagates). Nothing is ever evaluated as JavaScript.
 *
 *   expression := term (('+' | '-') term)*
 *   term       := unary (('*' | '/') unary)*
 *   unary      := ('-' | '+') unary | power
 *   power      := primary ('^' unary)?            right-associative; -x^2 is -(x^2)
 *   primary    := number | name | name '(' expression (',' expression)* ')' | '(' expression ')'
 */
export type ExprNode =
  | { type: 'number'; value: number; pos: number }
  | { type: 'variable'; name: string; pos: number; input: string }
  | { type: 'negate'; arg: ExprNode; pos: number }
  | { type: 'binary'; op: '+' | '-' | '*' | '/' | '^'; left: ExprNode; right: ExprNode; pos: number }
  | { type: 'call'; fn: FunctionName; args: ExprNode[]; pos: number };

export type FunctionName = 'abs' | 'exp' | 'log' | 'log10' | 'min' | 'max' | OceanFunction;
export type OceanFunction = 'oxygen_saturation' | 'aou' | 'nstar' | 'nstar_simple';

/**
 * What an ocean function needs of an argument. A plain variable given there is read in the units the
 * function needs (converted like any compared variable, density included); salinity is taken as it is
 * but must be a salinity. An argument that is itself an expression is taken as already in those units.
 */
export type ArgumentNeed = { units: string; oxygen?: boolean } | { salinity: true };

const OXYGEN: ArgumentNeed = { units: 'umol kg-1', oxygen: true };
const THETA: ArgumentNeed = { units: 'degC' };
const SALINITY: ArgumentNeed = { salinity: true };
const NUTRIENT: ArgumentNeed = { units: 'umol kg-1' };

interface FunctionSpec {
  min: number;
  max: number;
  /** for ocean functions, what each argument must be */
  needs?: ArgumentNeed[];
}

/** Known functions; a table without a prototype, so 'constructor(' or 'toString(' is an unknown function. */
const FUNCTIONS: Record<FunctionName, FunctionSpec> = Object.assign(Object.create(null) as Record<FunctionName, FunctionSpec>, {
  abs: { min: 1, max: 1 },
  exp: { min: 1, max: 1 },
  log: { min: 1, max: 1 },
  log10: { min: 1, max: 1 },
  min: { min: 2, max: Infinity },
  max: { min: 2, max: Infinity },
  // Garcia & Gordon (1992) O₂ solubility, µmol/kg, from potential temperature (°C) and practical salinity
  oxygen_saturation: { min: 2, max: 2, needs: [THETA, SALINITY] },
  // apparent oxygen utilisation, µmol/kg: oxygen_saturation(θ, S) − O₂
  aou: { min: 3, max: 3, needs: [OXYGEN, THETA, SALINITY] },
  // N* of Gruber & Sarmiento (1997), µmol/kg: (N − 16 P + 2.90) · 0.87
  nstar: { min: 2, max: 2, needs: [NUTRIENT, NUTRIENT] },
  // the simplified N − 16 P + 2.9, µmol/kg
  nstar_simple: { min: 2, max: 2, needs: [NUTRIENT, NUTRIENT] },
});

/** One input an expression reads: a variable as it is, or in the units an ocean function needs. */
export interface ExpressionInput {
  /** the key evaluation looks it up by: the name, or "name [units]" */
  key: string;
  /** the recipe variable */
  name: string;
  need?: ArgumentNeed;
}

interface Token {
  kind: 'number' | 'name' | 'op' | '(' | ')' | ',' | 'end';
  text: string;
  value: number;
  /** 1-based character position in the expression */
  pos: number;
}

export interface ParsedExpression {
  text: string;
  ast: ExprNode;
  /** variable names used, in order of first appearance */
  variables: string[];
  /** what is read: each variable as it is, or in the units a function needs of it */
  inputs: ExpressionInput[];
}

function fail(text: string, pos: number, what: string): never {
  throw new StillwaterError('E_INPUT', `Expression '${text}': ${what} at position ${pos}.`);
}

export function tokenize(text: string): Token[] {
  const out: Token[] = [];
  let i = 0;
  while (i < text.length) {
    const ch = text[i];
    if (ch === ' ' || ch === '\t' || ch === '\n' || ch === '\r') {
      i++;
      continue;
    }
    const pos = i + 1;
    const num = /^(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?/.exec(text.slice(i));
    if (num) {
      out.push({ kind: 'number', text: num[0], value: Number(num[0]), pos });
      i += num[0].length;
      continue;
    }
    const name = /^[A-Za-z_][A-Za-z0-9_]*/.exec(text.slice(i));
    if (name) {
      out.push({ kind: 'name', text: name[0], value: NaN, pos });
      i += name[0].length;
      continue;
    }
    if ('+-*/^'.includes(ch)) out.push({ kind: 'op', text: ch, value: NaN, pos });
    else if (ch === '(' || ch === ')' || ch === ',') out.push({ kind: ch, text: ch, value: NaN, pos });
    else fail(text, pos, `unexpected character '${ch}'`);
    i++;
  }
  out.push({ kind: 'end', text: '', value: NaN, pos: text.length + 1 });
  return out;
}

export function parseExpression(text: string): ParsedExpression {
  if (text.trim() === '') throw new StillwaterError('E_INPUT', 'Expression is empty.');
  const tokens = tokenize(text);
  let p = 0;
  const variables: string[] = [];
  const inputs: ExpressionInput[] = [];
  const addInput = (name: string, need?: ArgumentNeed): string => {
    const key = need && 'units' in need ? `${name} [${need.units}]` : need ? `${name} [salinity]` : name;
    if (!inputs.some((x) => x.key === key)) inputs.push(need ? { key, name, need } : { key, name });
    return key;
  };
  const peek = (): Token => tokens[p];
  const next = (): Token => tokens[p++];
  const describe = (t: Token): string => (t.kind === 'end' ? 'unexpected end of expression' : `unexpected '${t.text}'`);

  function expression(): ExprNode {
    let left = term();
    while (peek().kind === 'op' && (peek().text === '+' || peek().text === '-')) {
      const t = next();
      left = { type: 'binary', op: t.text as '+' | '-', left, right: term(), pos: t.pos };
    }
    return left;
  }
  function term(): ExprNode {
    let left = unary();
    while (peek().kind === 'op' && (peek().text === '*' || peek().text === '/')) {
      const t = next();
      left = { type: 'binary', op: t.text as '*' | '/', left, right: unary(), pos: t.pos };
    }
    return left;
  }
  function unary(): ExprNode {
    const t = peek();
    if (t.kind === 'op' && (t.text === '-' || t.text === '+')) {
      next();
      const arg = unary();
      return t.text === '-' ? { type: 'negate', arg, pos: t.pos } : arg;
    }
    return power();
  }
  function power(): ExprNode {
    const base = primary();
    if (peek().kind === 'op' && peek().text === '^') {
      const t = next();
      return { type: 'binary', op: '^', left: base, right: unary(), pos: t.pos };
    }
    return base;
  }
  function primary(): ExprNode {
    const t = next();
    if (t.kind === 'number') {
      if (!Number.isFinite(t.value)) fail(text, t.pos, `number '${t.text}' is out of range`);
      return { type: 'number', value: t.value, pos: t.pos };
    }
    if (t.kind === 'name') {
      if (peek().kind === '(') {
        if (!(t.text in FUNCTIONS)) fail(text, t.pos, `unknown function '${t.text}' (known: ${Object.keys(FUNCTIONS).join(', ')})`);
        const fn = t.text as FunctionName;
        next();
        const args: ExprNode[] = [expression()];
        while (peek().kind === ',') {
          next();
          args.push(expression());
        }
        const close = next();
        if (close.kind !== ')') fail(text, close.pos, `${describe(close)}; expected ')' or ','`);
        const { min, max, needs } = FUNCTIONS[fn];
        if (args.length < min || args.length > max) {
          fail(text, t.pos, `${fn} takes ${min === max ? min : `at least ${min}`} argument${min === 1 && max === 1 ? '' : 's'}, got ${args.length}`);
        }
        if (needs) {
          args.forEach((a, i) => {
            if (a.type === 'variable') a.input = addInput(a.name, needs[i]);
          });
        }
        return { type: 'call', fn, args, pos: t.pos };
      }
      if (!variables.includes(t.text)) variables.push(t.text);
      return { type: 'variable', name: t.text, pos: t.pos, input: t.text };
    }
    if (t.kind === '(') {
      const inner = expression();
      const close = next();
      if (close.kind !== ')') fail(text, close.pos, `${describe(close)}; expected ')'`);
      return inner;
    }
    return fail(text, t.pos, describe(t));
  }

  const ast = expression();
  const rest = peek();
  if (rest.kind !== 'end') fail(text, rest.pos, describe(rest));
  // variables used outside ocean-function arguments are read as they are
  const walk = (node: ExprNode): void => {
    if (node.type === 'variable' && node.input === node.name) addInput(node.name);
    else if (node.type === 'negate') walk(node.arg);
    else if (node.type === 'binary') [node.left, node.right].forEach(walk);
    else if (node.type === 'call') node.args.forEach(walk);
  };
  walk(ast);
  return { text, ast, variables, inputs };
}

export type ExprInput = Float32Array | Float64Array | number;

/**
 * Evaluate over arrays of length n (numbers broadcast). Inputs are looked up by ExpressionInput.key (the
 * plain name for a variable read as it is). Names not given are an error naming the name and its position.
 * Result Float32Array, NaN wherever an input is NaN or the value undefined.
 */
export function evaluateExpression(parsed: ParsedExpression, inputs: Record<string, ExprInput>, n: number): Float32Array {
  const values = evalNode(parsed.ast, parsed.text, inputs, n);
  const out = new Float32Array(n);
  if (typeof values === 'number') out.fill(values);
  else out.set(values);
  return out;
}

function evalNode(node: ExprNode, text: string, inputs: Record<string, ExprInput>, n: number): Float64Array | number {
  switch (node.type) {
    case 'number':
      return node.value;
    case 'variable': {
      const v = Object.prototype.hasOwnProperty.call(inputs, node.input) ? inputs[node.input] : undefined;
      if (v === undefined) fail(text, node.pos, `no variable named '${node.name}'`);
      if (typeof v === 'number') return v;
      if (v.length !== n) fail(text, node.pos, `variable '${node.name}' has ${v.length} values, expected ${n}`);
      return Float64Array.from(v);
    }
    case 'negate':
      return map1(evalNode(node.arg, text, inputs, n), (a) => -a);
    case 'binary': {
      const a = evalNode(node.left, text, inputs, n), b = evalNode(node.right, text, inputs, n);
      switch (node.op) {
        case '+':
          return map2(a, b, n, (x, y) => x + y);
        case '-':
          return map2(a, b, n, (x, y) => x - y);
        case '*':
          return map2(a, b, n, (x, y) => x * y);
        case '/':
          return map2(a, b, n, (x, y) => x / y);
        case '^':
          return map2(a, b, n, (x, y) => Math.pow(x, y));
      }
      break;
    }
    case 'call': {
      const args = node.args.map((x) => evalNode(x, text, inputs, n));
      switch (node.fn) {
        case 'abs':
          return map1(args[0], Math.abs);
        case 'exp':
          return map1(args[0], Math.exp);
        case 'log':
          return map1(args[0], Math.log);
        case 'log10':
          return map1(args[0], Math.log10);
        case 'min':
          return args.reduce((acc, x) => map2(acc, x, n, Math.min));
        case 'max':
          return args.reduce((acc, x) => map2(acc, x, n, Math.max));
        case 'oxygen_saturation':
          return oxygenSaturationLevel(spread(args[0], n), spread(args[1], n));
        case 'aou':
          return aouLevel(spread(args[0], n), spread(args[1], n), spread(args[2], n));
        case 'nstar':
          return nStarLevel(spread(args[0], n), spread(args[1], n), 'gruber-sarmiento-1997').values;
        case 'nstar_simple':
          return nStarLevel(spread(args[0], n), spread(args[1], n), 'simplified').values;
      }
    }
  }
  throw new StillwaterError('E_INTERNAL', 'unknown expression node');
}

/** A number broadcast to n values (arrays pass through). */
function spread(a: Float64Array | number, n: number): Float64Array {
  return typeof a === 'number' ? new Float64Array(n).fill(a) : a;
}

function map1(a: Float64Array | number, f: (x: number) => number): Float64Array | number {
  if (typeof a === 'number') return f(a);
  for (let i = 0; i < a.length; i++) a[i] = f(a[i]);
  return a;
}

function map2(a: Float64Array | number, b: Float64Array | number, n: number, f: (x: number, y: number) => number): Float64Array | number {
  if (typeof a === 'number' && typeof b === 'number') return f(a, b);
  const out = typeof a !== 'number' ? a : new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = f(typeof a === 'number' ? a : a[i], typeof b === 'number' ? b : b[i]);
  return out;
}
