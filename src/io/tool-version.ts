import { readFileSync } from 'node:fs';

let cached: string | undefined;

/** The tool's version from package.json (recorded in every plate's metadata). */
export function toolVersion(): string {
  if (cached === undefined) {
    const here = new URL('.', import.meta.url);
    // src/cli (tests) or dist/src/cli (built): walk up until package.json is found.
    for (const up of ['../../package.json', '../../../package.json']) {
      try {
        const pkg = JSON.parse(readFileSync(new URL(up, here), 'utf8')) as { name?: string; version?: string };
        if (pkg.name === 'quadatlas' && typeof pkg.version === 'string') {
          cached = pkg.version;
          break;
        }
      } catch {
        /* try the next candidate */
      }
    }
    cached ??= '0.0.0';
  }
  return cached;
}
