// WebAssembly's trap handler reserves about 10 GB of address space per memory, so under an address-space
// limit (`ulimit -v`, common on batch schedulers) every WebAssembly module fails to start. Node must be
// started without the trap handler there (bounds are then checked in code, a little slower): this says
// whether the current process needs a restart with that flag.
import { readFileSync } from 'node:fs';

export const NO_TRAP_HANDLER = '--disable-wasm-trap-handler';

/** The soft address-space limit in bytes from /proc/self/limits (Linux), or undefined when unlimited or unknown. */
export function addressSpaceLimit(limitsText = readLimits()) {
  const line = limitsText?.split('\n').find((l) => l.startsWith('Max address space'));
  const soft = line?.slice('Max address space'.length).trim().split(/\s+/)[0];
  return soft && /^\d+$/.test(soft) ? Number(soft) : undefined;
}

function readLimits() {
  try {
    return readFileSync('/proc/self/limits', 'utf8');
  } catch {
    return undefined;
  }
}

/** True when this process runs under an address-space limit without the flag that lets WebAssembly start. */
export function needsRestartWithoutTrapHandler() {
  if (process.execArgv.includes(NO_TRAP_HANDLER) || (process.env.NODE_OPTIONS ?? '').includes(NO_TRAP_HANDLER)) return false;
  return addressSpaceLimit() !== undefined;
}
