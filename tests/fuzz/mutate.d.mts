// Types of tests/fuzz/mutate.mjs (plain JavaScript, shared by the harness and the driver scripts).
export declare function rng(seed: number): () => number;
export declare const KINDS: string[];
export declare function mutant(bytes: Uint8Array, seed: number, index: number): { kind: string; where: number; bytes: Uint8Array };
