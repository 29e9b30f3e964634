import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

/** One line of the C reference's report. */
export interface CFigure {
  readonly iterations: number;
  readonly seconds: number;
  readonly gigaPerSecond: number;
}

export interface CReport {
  readonly scalar: CFigure;
  readonly vector: CFigure;
}

/** The yardstick's source: shared/bench-ref/escape-ref.c beside the project root. */
export function cReferenceSource(root: string): string {
  return path.resolve(root, '../shared/bench-ref/escape-ref.c');
}

/** Whether a C compiler answers as `cc`. */
export function haveCompiler(): boolean {
  const r = spawnSync('cc', ['--version'], { stdio: 'ignore' });
  return r.status === 0;
}

function parseLine(text: string, which: 'scalar' | 'vector'): CFigure {
  const m = new RegExp(`^${which}: (\\d+) iterations, ([\\d.]+) s, ([\\d.]+) G iterations/s`, 'm').exec(text);
  if (m === null) throw new Error(`escape-ref printed no ${which} line:\n${text}`);
  return { iterations: Number(m[1]), seconds: Number(m[2]), gigaPerSecond: Number(m[3]) };
}

/**
 * Builds escape-ref.c with `cc <flags>` into a temporary folder, runs it
 * `<width> <limit>` `runs` times and returns its best scalar and vector figures.
 */
export function runCReference(source: string, flags: readonly string[], width: number, limit: number, runs = 1): CReport {
  const dir = mkdtempSync(path.join(tmpdir(), 'quadatlas-bench-'));
  try {
    const exe = path.join(dir, 'escape-ref');
    const build = spawnSync('cc', [...flags, '-o', exe, source], { encoding: 'utf8' });
    if (build.status !== 0 || !existsSync(exe)) throw new Error(`cc ${flags.join(' ')} failed:\n${build.stderr}`);
    let best: CReport | undefined;
    for (let r = 0; r < runs; r++) {
      const run = spawnSync(exe, [String(width), String(limit)], { encoding: 'utf8' });
      if (run.status !== 0) throw new Error(`escape-ref exited with ${run.status}:\n${run.stdout}${run.stderr}`);
      const scalar = parseLine(run.stdout, 'scalar'),
        vector = parseLine(run.stdout, 'vector');
      best = {
        scalar: best === undefined || scalar.seconds < best.scalar.seconds ? scalar : best.scalar,
        vector: best === undefined || vector.seconds < best.vector.seconds ? vector : best.vector,
      };
    }
    return best!;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
