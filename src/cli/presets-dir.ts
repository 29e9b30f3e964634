import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** The presets/ folder shipped with the tool (found from src/cli or dist/src/cli). */
export function presetsDir(): string {
  for (const up of ['../../presets/', '../../../presets/']) {
    const dir = fileURLToPath(new URL(up, import.meta.url));
    if (existsSync(dir)) return dir;
  }
  throw new Error('presets/ folder not found next to the tool');
}
