// Renders every preset with the quadatlas checkout at argv[2] (default: this one)
// into a temporary folder and prints, per output file, the SHA-256 of the file
// and of its decoded pixels (sharp, raw 8 or 16 bits). Used to record what a
// speed commit changed: `node scripts/preset-hashes.mjs [checkout]`.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import sharp from 'sharp';

const here = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const root = path.resolve(process.argv[2] ?? here);
const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-hashes-'));
const sha = (b) => createHash('sha256').update(b).digest('hex').slice(0, 16);
try {
  const r = spawnSync(process.execPath, [path.join(root, 'dist/src/cli/main.js'), 'presets', 'render', '--all', '--out-dir', dir], {
    encoding: 'utf8',
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  if (r.status !== 0) throw new Error(`presets render failed (${r.status})`);
  for (const name of readdirSync(dir).sort()) {
    if (name.endsWith('.json') || name.startsWith('.')) continue;
    const file = path.join(dir, name);
    const bytes = readFileSync(file);
    let pixels = '-';
    if (/\.(png|tiff?)$/i.test(name)) {
      const m = await sharp(file, { limitInputPixels: false }).metadata();
      pixels = sha(
        await sharp(file, { limitInputPixels: false })
          .raw({ depth: m.depth === 'ushort' ? 'ushort' : 'uchar' })
          .toBuffer(),
      );
    }
    console.log(`${name.padEnd(36)} file ${sha(bytes)}  pixels ${pixels}  ${bytes.length} bytes`);
  }
} finally {
  rmSync(dir, { recursive: true, force: true });
}
