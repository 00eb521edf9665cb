/**
 * The one error type that reaches a person: a code, one plain sentence, and the
 * file / variable / recipe path it concerns. Anything else thrown is an internal fault.
 */
export type ErrorCode =
  | 'E_FILE' // missing, unreadable or unwritable file or folder
  | 'E_FORMAT' // bytes are not a format we read, or are damaged
  | 'E_VARIABLE' // a variable is missing or has the wrong shape
  | 'E_COORDS' // coordinates missing, non-monotonic, inconsistent
  | 'E_UNITS' // unknown units or no conversion path
  | 'E_GRID' // grids that do not fit together
  | 'E_RECIPE' // recipe validation
  | 'E_INPUT' // any other bad argument from a person
  | 'E_CANCELLED' // work cancelled by a person
  | 'E_BUSY' // more work asked for at once than the workbench queues
  | 'E_INTERNAL';

export interface ErrorSubject {
  file?: string;
  variable?: string;
  /** recipe path such as runs[1].variables.O2.file */
  path?: string;
}

/** Longest name or attribute text shown in a message (longer ones are cut in the middle). */
export const NAME_LIMIT = 80;
/** Longest path shown in a message. */
export const PATH_LIMIT = 200;
/** Longest message: one sentence, never a page. */
export const MESSAGE_LIMIT = 500;

/**
 * Text from a file or a person made safe to print on a console, in a page or in an output file: control
 * characters (NUL, escape sequences, newlines), bidirectional overrides and lone surrogates shown as
 * escapes, and text longer than `max` cut in the middle (the end of a path, the file name, stays).
 * Every message goes through it (StillwaterError does so for the whole sentence as a last guard);
 * names and attribute text are passed through it with their own, shorter limit where they are quoted.
 */
export function printable(text: string, max = NAME_LIMIT): string {
  let out = '';
  let shown = 0;
  const chars = Array.from(String(text));
  const keep = chars.length > max ? Math.max(1, max - 1) : chars.length;
  const head = chars.length > max ? Math.ceil(keep / 2) : keep;
  const tailFrom = chars.length > max ? chars.length - (keep - head) : chars.length;
  for (let i = 0; i < chars.length; i++) {
    if (i === head && head < tailFrom) {
      out += '…';
      i = tailFrom - 1;
      continue;
    }
    out += escapeChar(chars[i]);
    shown++;
  }
  return shown === 0 && chars.length > 0 ? '…' : out;
}

/** A name quoted for a sentence: 'name', printable and cut to NAME_LIMIT. */
export function quoted(name: string): string {
  return `'${printable(name, NAME_LIMIT)}'`;
}

function escapeChar(c: string): string {
  const cp = c.codePointAt(0) ?? 0;
  if (cp < 0x20 || (cp >= 0x7f && cp <= 0x9f)) return `\\x${cp.toString(16).padStart(2, '0')}`;
  // bidirectional overrides and isolates reorder what follows; lone surrogates are not text
  if ((cp >= 0x202a && cp <= 0x202e) || (cp >= 0x2066 && cp <= 0x2069) || (cp >= 0xd800 && cp <= 0xdfff) || cp === 0xfeff) {
    return `\\u{${cp.toString(16)}}`;
  }
  return c;
}

export class StillwaterError extends Error {
  readonly code: ErrorCode;
  readonly subject: ErrorSubject;
  constructor(code: ErrorCode, sentence: string, subject: ErrorSubject = {}) {
    super(printable(sentence, MESSAGE_LIMIT));
    this.name = 'StillwaterError';
    this.code = code;
    this.subject = subject;
  }
  /** Bad input (exit 2) versus a fault of ours (exit 1). */
  get isBadInput(): boolean {
    return this.code !== 'E_INTERNAL';
  }
  toJSON(): { code: ErrorCode; message: string } & ErrorSubject {
    const subject: ErrorSubject = {};
    if (this.subject.file !== undefined) subject.file = printable(this.subject.file, PATH_LIMIT);
    if (this.subject.variable !== undefined) subject.variable = printable(this.subject.variable, NAME_LIMIT);
    if (this.subject.path !== undefined) subject.path = printable(this.subject.path, PATH_LIMIT);
    return { code: this.code, message: this.message, ...subject };
  }
}

export function isStillwaterError(e: unknown): e is StillwaterError {
  return e instanceof StillwaterError;
}

/** Shorthand used by readers: "<file>: <sentence>" (the path and the name made printable and cut). */
export function fileError(code: ErrorCode, file: string, sentence: string, variable?: string): StillwaterError {
  const path = printable(file, PATH_LIMIT);
  const where = variable !== undefined ? `${path}, variable ${quoted(variable)}` : path;
  return new StillwaterError(code, `${where}: ${sentence}`, { file, variable });
}
