/**
 * The part of the WebAssembly JS API the kernels use, declared here because
 * the project's lib (ES2022, no DOM) carries no WebAssembly types.
 */
interface WasmApi {
  validate(bytes: Uint8Array<ArrayBuffer>): boolean;
  Module: new (bytes: Uint8Array<ArrayBuffer>) => object;
  Instance: new (module: object, imports: object) => { readonly exports: object };
}

function decodeBase64(text: string): Uint8Array<ArrayBuffer> {
  const binary = atob(text);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  return bytes;
}

/**
 * Compiles and instantiates a module embedded as base64 (the *-bytes.ts files
 * scripts/build-wasm.mjs writes), synchronously and with no imports; returns
 * its exports, or undefined when this runtime has no WebAssembly or rejects
 * the module (no SIMD, for the kernels here). Each call is a fresh instance
 * with its own memory, for one thread.
 */
export function instantiateWasm(base64: string): object | undefined {
  const wasm = (globalThis as { WebAssembly?: WasmApi }).WebAssembly;
  if (wasm === undefined) return undefined;
  const bytes = decodeBase64(base64);
  if (!wasm.validate(bytes)) return undefined;
  return new wasm.Instance(new wasm.Module(bytes), {}).exports;
}
