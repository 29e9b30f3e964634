/**
 * Where a worker entry point's built script is. Worker threads run the
 * compiled JavaScript in dist/src/workers/; code that runs from src/ (the
 * tests, through vitest) still starts the built script.
 */

/** The URL of dist/src/workers/NAME.js, from src/ or from dist/. */
export function builtWorkerUrl(name: string): URL {
  const here = import.meta.url;
  return here.endsWith('.ts') ? new URL(`../../dist/src/workers/${name}.js`, here) : new URL(`../workers/${name}.js`, here);
}
