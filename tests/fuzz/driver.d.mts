// Types of tests/fuzz/driver.mjs.
export interface FuzzRecord {
  index: number;
  kind: string;
  where?: number;
  code: 0 | 1 | 2 | 'hang' | 'crash';
  message: string;
  problem?: string;
  unchanged: boolean;
  maxRssMb: number;
}
export interface FuzzTally {
  total: number;
  ok: number;
  refused: number;
  unreadable: number;
  /** refusals because the HDF5 library did not return within its deadline */
  deadline: number;
  fault: number;
  hang: number;
  crash: number;
  changed: number;
  maxRssMb: number;
}
export declare function buildHarness(): Promise<string>;
export declare function fuzzFixture(
  harness: string,
  fixture: string,
  opts: { seed: number; count: number; timeLimitMs?: number; addressSpaceKb?: number; heapMb?: number; onRecord?: (r: FuzzRecord) => void },
): Promise<FuzzRecord[]>;
export declare function tally(records: FuzzRecord[]): FuzzTally;
