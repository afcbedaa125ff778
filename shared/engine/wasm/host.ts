/**
 * The host's WebAssembly API (browsers and Node both have it), reached through `globalThis` with
 * only the few members used here typed: `shared/` is typechecked without DOM or Node types.
 * Compilation is synchronous; the browser allows that on its main thread up to 8 MB of module
 * (measured in Chromium 156), far above what the rung limit lets a program become.
 */

/** A module's memory; its buffer never changes, because every memory here has a fixed size. */
export interface WasmMemory {
  readonly buffer: ArrayBuffer;
}

/** A compiled module (opaque). */
export type WasmModule = object;

export interface WasmInstance {
  readonly exports: Record<string, unknown>;
}

interface WasmApi {
  Memory: new (descriptor: { initial: number; maximum: number }) => WasmMemory;
  Module: new (bytes: Uint8Array) => WasmModule;
  Instance: new (module: WasmModule, imports: Record<string, Record<string, unknown>>) => WasmInstance;
}

function api(): WasmApi {
  const found = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;
  if (found === undefined) throw new Error('the scan engine needs WebAssembly, which this JavaScript host does not have');
  return found;
}

/** A fixed-size memory of `pages` 64 KiB pages. */
export function createWasmMemory(pages: number): WasmMemory {
  return new (api().Memory)({ initial: pages, maximum: pages });
}

/**
 * Compile a module. A page whose Content Security Policy lacks `'wasm-unsafe-eval'` refuses
 * this; that is a deployment fault, said plainly, never worked around.
 */
export function compileWasm(bytes: Uint8Array): WasmModule {
  try {
    return new (api().Module)(bytes);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new Error(`the scan engine could not compile its WebAssembly (a page needs script-src 'wasm-unsafe-eval'): ${reason}`);
  }
}

/** Instantiate a kernel module over `memory`; its `scan(dt)` export. */
export function instantiateKernel(module: WasmModule, memory: WasmMemory): (dtMs: number) => void {
  const instance = new (api().Instance)(module, { env: { m: memory } });
  const scan = instance.exports.scan;
  if (typeof scan !== 'function') throw new TypeError('wasm: the kernel exports no scan function');
  return scan as (dtMs: number) => void;
}
