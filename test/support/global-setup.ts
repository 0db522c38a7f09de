// Before any test file: the WebAssembly time step built from its sources when stale (bin/build-wasm.mjs), so
// every test that goes through the CLI's entry (which provides build/fdtd-step.wasm) steps with it.
import { buildWasm } from '../../bin/build-wasm.mjs';

export default async function setup(): Promise<void> {
  await buildWasm();
}
