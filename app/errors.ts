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
  | 'E_INTERNAL';

export interface ErrorSubject {
  file?: string;
  variable?: string;
  /** recipe path such as runs[1].variables.O2.file */
  path?: string;
}

export class StillwaterError extends Error {
  readonly code: ErrorCode;
  readonly subject: ErrorSubject;
  constructor(code: ErrorCode, sentence: string, subject: ErrorSubject = {}) {
    super(sentence);
    this.name = 'StillwaterError';
    this.code = code;
    this.subject = subject;
  }
  /** Bad input (exit 2) versus a fault of ours (exit 1). */
  get isBadInput(): boolean {
    return this.code !== 'E_INTERNAL';
  }
  toJSON(): { code: ErrorCode; message: string } & ErrorSubject {
    return { code: this.code, message: this.message, ...this.subject };
  }
}

export function isStillwaterError(e: unknown): e is StillwaterError {
  return e instanceof StillwaterError;
}

/** Shorthand used by readers: "<file>: <sentence>". */
export function fileError(code: ErrorCode, file: string, sentence: string, variable?: string): StillwaterError {
  const where = variable ? `${file}, variable '${variable}'` : file;
  return new StillwaterError(code, `${where}: ${sentence}`, { file, variable });
}
