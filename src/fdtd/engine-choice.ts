// Which engine a run gets: the WebAssembly one when a module has been provided (wasm/module.ts) and it
// instantiates, else the TypeScript kernel. `engine: 'js'` asks for the reference kernel; 'wasm-simd' insists
// on WebAssembly (an Error when it cannot be had).

import { type EngineInput, type EngineKind, type StepEngine } from './engine.ts';
import { JsEngine } from './engine-js.ts';
import { WasmEngine } from './wasm/engine.ts';
import { stepModule, stepModuleFailure } from './wasm/module.ts';

export interface ChosenEngine {
  engine: StepEngine;
  /** Why a run that could have used WebAssembly steps with the TypeScript kernel (null when it does not, or was asked to). */
  fallback: string | null;
}

export function chooseEngine(input: EngineInput, asked?: EngineKind): ChosenEngine {
  if (asked === 'js') return { engine: new JsEngine(input), fallback: null };
  const module = stepModule();
  let why = stepModuleFailure() ?? '';
  if (module !== null) {
    try {
      return { engine: new WasmEngine(module, input), fallback: null };
    } catch (e) {
      why = `the WebAssembly engine was not used: ${e instanceof Error ? e.message : String(e)}`;
    }
  }
  if (asked === 'wasm-simd') throw new Error(`engine 'wasm-simd' asked for, but ${why}`);
  return { engine: new JsEngine(input), fallback: why };
}

/** The engine a run made now would most likely step with (WebAssembly when a module is provided and compiles). */
export const expectedEngine = (): EngineKind => (stepModule() !== null ? 'wasm-simd' : 'js');
