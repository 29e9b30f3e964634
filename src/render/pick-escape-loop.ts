import { escapeLoop, type EscapeLoop } from '../plane/escape-loop.js';
import { loadWasmEscapeLoop } from '../plane/escape-loop-wasm.js';

/**
 * The escape loop the renderer uses: the WebAssembly SIMD twin when this
 * Node has WebAssembly SIMD, else the JS loop. Both give bit-identical
 * results (test/plane/escape-loop-wasm.test.ts), so the choice never changes
 * a byte of output. QUADATLAS_LOOP=js forces the JS loop (for comparisons).
 */
export function pickEscapeLoop(): EscapeLoop {
  if (process.env['QUADATLAS_LOOP'] === 'js') return escapeLoop;
  return loadWasmEscapeLoop() ?? escapeLoop;
}
