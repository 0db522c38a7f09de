// Reading descriptors and arrays in linear memory (AssemblyScript; compiled by bin/build-wasm.mjs).
// A descriptor is a run of 32-bit words at a 16-byte aligned address (src/fdtd/wasm/slots.ts).

/** Word `slot` of the descriptor at `d` (an address or a count). */
// @ts-ignore: decorator
@inline export function word(d: usize, slot: i32): usize {
  return <usize>load<u32>(d + (<usize>slot << 2));
}

/** Word `slot` read as a signed node index (−1: absent). */
// @ts-ignore: decorator
@inline export function node(d: usize, slot: i32): i32 {
  return load<i32>(d + (<usize>slot << 2));
}

/** The f64 at words slot, slot + 1. */
// @ts-ignore: decorator
@inline export function real(d: usize, slot: i32): f64 {
  return load<f64>(d + (<usize>slot << 2));
}

// @ts-ignore: decorator
@inline export function setReal(d: usize, slot: i32, v: f64): void {
  store<f64>(d + (<usize>slot << 2), v);
}

/** Address of element i of the f64 array at a. */
// @ts-ignore: decorator
@inline export function at(a: usize, i: i32): usize {
  return a + (<usize>i << 3);
}

// @ts-ignore: decorator
@inline export function get(a: usize, i: i32): f64 {
  return load<f64>(a + (<usize>i << 3));
}

// @ts-ignore: decorator
@inline export function put(a: usize, i: i32, v: f64): void {
  store<f64>(a + (<usize>i << 3), v);
}
