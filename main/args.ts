import { quoted, StillwaterError } from '../app/errors.js';

/** Parsed command-line options: --flag value, --flag=value, repeated flags collect, bare --switch is true. */
export interface ParsedArgs {
  positional: string[];
  options: Map<string, string[]>;
  switches: Set<string>;
}

export function parseArgs(argv: string[], switchNames: string[] = []): ParsedArgs {
  const positional: string[] = [];
  const options = new Map<string, string[]>();
  const switches = new Set<string>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (!a.startsWith('--')) {
      positional.push(a);
      continue;
    }
    const eq = a.indexOf('=');
    const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
    if (switchNames.includes(name)) {
      switches.add(name);
      continue;
    }
    const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
    if (value === undefined) throw new StillwaterError('E_INPUT', `Option --${name} needs a value.`);
    const list = options.get(name) ?? [];
    list.push(value);
    options.set(name, list);
  }
  return { positional, options, switches };
}

export function optional(args: ParsedArgs, name: string): string | undefined {
  const v = args.options.get(name);
  return v ? v[v.length - 1] : undefined;
}

export function required(args: ParsedArgs, name: string): string {
  const v = optional(args, name);
  if (v === undefined) throw new StillwaterError('E_INPUT', `Option --${name} is required.`);
  return v;
}

export function optionalNumber(args: ParsedArgs, name: string): number | undefined {
  const v = optional(args, name);
  if (v === undefined) return undefined;
  // Number('') and Number(' ') are 0: an empty value is refused, not taken as zero
  const n = v.trim() === '' ? NaN : Number(v);
  if (!Number.isFinite(n)) throw new StillwaterError('E_INPUT', `Option --${name} must be a number, got ${quoted(v)}.`);
  return n;
}

/** Reject options the command does not know, so a typo is never silently ignored. */
export function allowOnly(args: ParsedArgs, command: string, names: string[]): void {
  for (const k of [...args.options.keys(), ...args.switches]) {
    if (!names.includes(k)) throw new StillwaterError('E_INPUT', `stillwater ${command}: unknown option --${k}.`);
  }
}
