/**
 * The HDF5 library (h5wasm), loaded on first use only. Loading it instantiates its WebAssembly module, and
 * without the trap handler (as under `ulimit -v`) V8 reserves the module's whole 2.3 GiB of memory at once:
 * a thread that never opens a NetCDF-4 file (the server's, a pooled worker's, whose HDF5 calls go to a thread
 * of their own) must not pay that. A static import would load it with the bundle.
 */
export type H5wasm = typeof import('h5wasm/node').default;

let loaded: H5wasm | undefined;
let loading: Promise<H5wasm> | undefined;

export function loadH5wasm(): Promise<H5wasm> {
  loading ??= import('h5wasm/node').then((m) => (loaded = m.default));
  return loading;
}

/** The library, for code that holds one of its objects (which only exist once it has loaded). */
export function h5wasmLoaded(): H5wasm {
  if (!loaded) throw new Error('h5wasm is used before loadH5wasm() has settled.');
  return loaded;
}
