/**
 * The census at scale from the command line, as a user runs it:
 * `components --period P --out FILE.parquet` for P = 16, 20 and 22 (and 24
 * with QUADATLAS_BENCH_P24=1: several minutes; QUADATLAS_BENCH_P28=1 runs
 * period 28 alone, about an hour and 15 GB of disk), each timed from spawn to
 * exit, with the peak resident memory of the process (VmHWM from /proc, all
 * threads) and the time per component; the file's row count is read back
 * with hyparquet and checked against OEIS A000740. Issue 15's targets:
 * period 16 under 5 s, period 24 under 2 minutes and 1 GB.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchRow, BenchSection } from './bench-section.js';
import { a000740 } from './components-section.js';

/** Runs the CLI, sampling /proc/PID/status for the peak resident set; resolves with wall seconds and peak bytes. */
function runTimed(cli: string, args: readonly string[]): Promise<{ seconds: number; peak: number; code: number | null; stderr: string }> {
  return new Promise((resolve) => {
    const t0 = performance.now();
    const child = spawn(process.execPath, [cli, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr.on('data', (d: Buffer) => (stderr += d.toString()));
    let peak = 0;
    const sample = (): void => {
      try {
        const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${child.pid}/status`, 'utf8'));
        if (m) peak = Math.max(peak, Number(m[1]) * 1024);
      } catch {
        // the process has ended
      }
    };
    const timer = setInterval(sample, 200);
    child.on('exit', (code) => {
      clearInterval(timer);
      resolve({ seconds: (performance.now() - t0) / 1000, peak, code, stderr });
    });
  });
}

export const listingSection: BenchSection = {
  name: 'listing',
  title: 'components --period P --out FILE.parquet from the command line (2 workers): wall time, peak memory, time per component',
  async run(context) {
    const rows: BenchRow[] = [];
    const cli = path.join(context.root, 'dist/src/cli/main.js');
    const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-listing-'));
    const periods = process.env['QUADATLAS_BENCH_P28'] === '1' ? [28] : process.env['QUADATLAS_BENCH_P24'] === '1' ? [16, 20, 22, 24] : [16, 20, 22];
    const { parquetMetadataAsync, asyncBufferFromFile } = await import('hyparquet');
    try {
      for (const p of periods) {
        const file = path.join(dir, `p${p}.parquet`);
        const r = await runTimed(cli, ['components', '--period', String(p), '--out', file, '--workers', '2']);
        if (r.code !== 0) {
          context.note(`period ${p}: exit ${r.code}: ${r.stderr.trim().split('\n').pop()}`);
          continue;
        }
        const meta = await parquetMetadataAsync(await asyncBufferFromFile(file));
        const n = Number(meta.num_rows);
        if (n !== a000740(p)) context.note(`period ${p}: ${n} rows read back, OEIS A000740 says ${a000740(p)}`);
        // the CLI's own split (pairing, rows, distinctness) and warnings, as stderr ends them
        for (const line of r.stderr.split('\n').filter((l) => /components listed in|warning/.test(l))) context.note(`period ${p}: ${line.replace(/^quadatlas: /, '')}`);
        rows.push({ label: `period ${p}`, figures: { rows: n, seconds: r.seconds, peak_MB: r.peak / 2 ** 20, us_per_component: (1e6 * r.seconds) / n } });
        rmSync(file, { force: true });
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    context.note(
      'targets (issue 15): period 16 under 5 s; period 24 under 120 s and 1024 MB (QUADATLAS_BENCH_P24=1 runs it); period 28 under 45 min and 2048 MB (QUADATLAS_BENCH_P28=1)',
    );
    return rows;
  },
};
