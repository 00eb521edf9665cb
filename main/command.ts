/** A command of the stillwater command line. Results go to stdout, progress and messages to stderr. */
export interface Command {
  name: string;
  summary: string;
  usage: string;
  /** returns the exit code; throw StillwaterError for bad input (exit 2) */
  run(argv: string[]): Promise<number>;
}

export function out(text: string): void {
  process.stdout.write(text.endsWith('\n') ? text : text + '\n');
}

export function err(text: string): void {
  process.stderr.write(text.endsWith('\n') ? text : text + '\n');
}
