// Where the WebAssembly step comes from. The core never reads files or fetches: the host (the CLI, the browser
// worker, a test) provides the compiled module or its bytes, or a function that gives them on first use, and
// every pulse run created afterwards steps with it. Without one, or where WebAssembly SIMD is missing (the
// module then fails to compile), runs step with the TypeScript kernel.

export type StepModuleSource = BufferSource | WebAssembly.Module;

let pending: (() => StepModuleSource | null) | null = null;
let compiled: WebAssembly.Module | null = null;
let failure: string | null = 'no WebAssembly step module was provided';

/** Provide the module (or a loader called on first use; it may return null when there is none). */
export function provideStepModule(source: StepModuleSource | (() => StepModuleSource | null)): void {
  compiled = null;
  failure = null;
  pending = typeof source === 'function' ? (source as () => StepModuleSource | null) : () => source;
}

/** Forget the module: runs step with the TypeScript kernel. */
export function withdrawStepModule(why = 'the WebAssembly step module was withdrawn'): void {
  pending = null;
  compiled = null;
  failure = why;
}

function compile(source: StepModuleSource): WebAssembly.Module {
  if (typeof WebAssembly === 'undefined') throw new Error('this JavaScript engine has no WebAssembly');
  return source instanceof WebAssembly.Module ? source : new WebAssembly.Module(source);
}

/** The compiled module, or null (then `stepModuleFailure()` says why). */
export function stepModule(): WebAssembly.Module | null {
  if (pending !== null) {
    const load = pending;
    pending = null;
    try {
      const source = load();
      if (source === null) failure = 'the WebAssembly step module was not found';
      else compiled = compile(source);
    } catch (e) {
      failure = `the WebAssembly step module did not compile (${e instanceof Error ? e.message : String(e)}; WebAssembly SIMD may be missing)`;
    }
  }
  return compiled;
}

export function stepModuleFailure(): string | null {
  stepModule();
  return compiled === null ? failure : null;
}
