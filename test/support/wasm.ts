// The WebAssembly step for tests: built from its sources when stale (bin/build-wasm.mjs) and provided to the core.
import { readFileSync } from 'node:fs';
import { provideStepModule } from '../../src/fdtd/wasm/module.ts';
import { buildWasm } from '../../bin/build-wasm.mjs';

/** Build (if needed) and provide the step module; returns its bytes. */
export async function useWasmStep(): Promise<Uint8Array> {
  const path: string = await buildWasm();
  const bytes = new Uint8Array(readFileSync(path));
  provideStepModule(bytes);
  return bytes;
}
