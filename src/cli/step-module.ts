// The WebAssembly time step for the command line. The compiled CLI carries the module's bytes in itself
// (bin/build-cli.mjs defines SLABECHO_STEP_WASM as their base64); run from the sources, it reads
// build/fdtd-step.wasm (bin/slabecho.mjs rebuilds it first when stale). SLABECHO_ENGINE=js steps every run with
// the TypeScript kernel instead.

import { readFileSync } from 'node:fs';
import { provideStepModule, withdrawStepModule } from '../fdtd/wasm/module.ts';

declare const SLABECHO_STEP_WASM: string | undefined;

function stepModuleBytes(): Uint8Array | null {
  if (typeof SLABECHO_STEP_WASM === 'string') return Buffer.from(SLABECHO_STEP_WASM, 'base64');
  try {
    return readFileSync(new URL('../../build/fdtd-step.wasm', import.meta.url));
  } catch {
    return null;
  }
}

let provided = false;

/** Provide the step module (once per process; it is read and compiled when the first run is made). */
export function provideCliStepModule(): void {
  if (process.env.SLABECHO_ENGINE === 'js') {
    withdrawStepModule('SLABECHO_ENGINE=js asks for the TypeScript kernel');
    provided = false;
    return;
  }
  if (provided) return;
  provideStepModule(stepModuleBytes);
  provided = true;
}
