// Types of bin/build-wasm.mjs (vite.config.ts and the tests import it).
export const WASM_SOURCES: string[];
export const WASM_ENTRY: string;
export const WASM_MODULE: string;
export function wasmIsStale(outfile?: string): boolean;
export function buildWasm(options?: { force?: boolean; text?: boolean; outfile?: string }): Promise<string>;
