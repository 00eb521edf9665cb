/** What a session computation needs from its caller: where to report progress, and when to stop. */
export interface ServiceProgress {
  progress(fraction: number, message: string): void;
  signal: AbortSignal;
}
