import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { CLI, ROOT, type CliResult } from '../helpers/run-cli.js';

/** Every file below `dir` (relative path -> bytes), temporary files excluded. */
export function treeFiles(dir: string): Map<string, Buffer> {
  const out = new Map<string, Buffer>();
  const walk = (d: string): void => {
    for (const name of readdirSync(d)) {
      const full = path.join(d, name);
      if (statSync(full).isDirectory()) walk(full);
      else if (!name.endsWith('.tmp')) out.set(path.relative(dir, full), readFileSync(full));
    }
  };
  walk(dir);
  return out;
}

/** Names of files that differ between two trees (missing on either side included). */
export function treeDifferences(a: Map<string, Buffer>, b: Map<string, Buffer>): string[] {
  const names = new Set([...a.keys(), ...b.keys()]);
  return [...names].filter((n) => !(a.has(n) && b.has(n) && a.get(n)!.equals(b.get(n)!))).sort();
}

/** Width and height from a PNG's IHDR (PNG spec 11.2.2: bytes 16-23, big-endian). */
export function pngSize(bytes: Buffer): [number, number] {
  return [bytes.readUInt32BE(16), bytes.readUInt32BE(20)];
}

export interface ExpectedTile {
  readonly path: string;
  readonly width: number;
  readonly height: number;
}

/**
 * The tiles an info.json promises, derived from the IIIF Image API 3.0 text alone: for each
 * scale factor s the tile covers a region of (tile width x s) full-image pixels (section 5.6),
 * clipped to the image, requested at size ceil(w / s), ceil(h / s) (section 4.2 "w,h");
 * region "full" for the whole image, size "max" for the full size (section 4.7, canonical form).
 */
export function promisedTiles(info: { width: number; height: number; tiles: Array<{ width: number; height?: number; scaleFactors: number[] }> }, format: string): ExpectedTile[] {
  const W = info.width;
  const H = info.height;
  const out: ExpectedTile[] = [];
  for (const t of info.tiles) {
    const tw = t.width;
    const th = t.height ?? t.width;
    for (const s of t.scaleFactors) {
      for (let y = 0; y < H; y += th * s) {
        for (let x = 0; x < W; x += tw * s) {
          const w = Math.min(tw * s, W - x);
          const h = Math.min(th * s, H - y);
          const sw = Math.ceil(w / s);
          const sh = Math.ceil(h / s);
          const region = x === 0 && y === 0 && w === W && h === H ? 'full' : `${x},${y},${w},${h}`;
          const size = sw === W && sh === H ? 'max' : `${sw},${sh}`;
          out.push({ path: `${region}/${size}/0/default.${format}`, width: sw, height: sh });
        }
      }
    }
  }
  return out;
}

/**
 * Runs the built CLI like runCli, with extra environment variables; the batch scheduler's
 * variables of the surrounding environment are removed so a test never inherits a shard.
 */
export function runWithEnv(args: readonly string[], env: Record<string, string> = {}): CliResult {
  const base: NodeJS.ProcessEnv = { ...process.env, NO_COLOR: '1' };
  for (const k of Object.keys(base)) if (k.startsWith('SLURM_ARRAY_') || k === 'JOB_COMPLETION_INDEX') delete base[k];
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', input: '', env: { ...base, ...env } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
