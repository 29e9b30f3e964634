// The benchmark harness: `npm run bench [-- <section> ...]` runs the sections
// of SECTIONS in order (or only those named), prints each as a plain table
// and writes every figure to out/bench.json. Synthetic inputs only.
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { cpus } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchRow, BenchSection } from './bench-section.js';
import { kernelSection } from './kernel-section.js';
import { plateSection, posterSection } from './plate-section.js';
import { deepSection } from './deep-section.js';
import { deepAutoSection } from './deep-auto-section.js';
import { deepCopySection } from './deep-copy-section.js';
import { pyramidSection } from './pyramid-section.js';
import { componentsSection } from './components-section.js';
import { listingSection } from './listing-section.js';
import { sliceSection } from './slice-section.js';
import { constantsSection } from './constants-section.js';
import { certifySection } from './certify-section.js';
import { juliaSection } from './julia-section.js';
import { pipelineSection } from './pipeline-section.js';

/**
 * The section registry, run in this order.
 * Renderer sections go here (added by the renderer's owner):
 *   - speed-up of a plate from 1 worker to all workers;
 *   - a 4000 x 4000 plate at 4 samples per pixel: wall time and peak memory.
 */
export const SECTIONS: readonly BenchSection[] = [
  kernelSection,
  pipelineSection,
  plateSection,
  posterSection,
  juliaSection,
  deepSection,
  deepAutoSection,
  deepCopySection,
  componentsSection,
  listingSection,
  certifySection,
  sliceSection,
  constantsSection,
  pyramidSection,
];

interface SectionResult {
  readonly name: string;
  readonly title: string;
  readonly rows: BenchRow[];
  readonly notes: string[];
  readonly seconds: number;
}

/** The folder holding package.json, found upwards from this file (bench/ or dist/bench/). */
function projectRoot(): string {
  let dir = path.dirname(fileURLToPath(import.meta.url));
  while (!existsSync(path.join(dir, 'package.json'))) {
    const up = path.dirname(dir);
    if (up === dir) throw new Error('no package.json above bench/');
    dir = up;
  }
  return dir;
}

function formatFigure(value: number | string | null): string {
  if (value === null) return '-';
  if (typeof value === 'string') return value;
  if (Number.isInteger(value)) return String(value);
  const magnitude = Math.abs(value);
  return magnitude >= 1000 ? value.toFixed(0) : value.toPrecision(4);
}

/** A plain text table: the label column left-aligned, figures right-aligned. */
export function formatTable(rows: readonly BenchRow[]): string {
  const columns: string[] = [];
  for (const r of rows) for (const key of Object.keys(r.figures)) if (!columns.includes(key)) columns.push(key);
  const cells = rows.map((r) => [r.label, ...columns.map((c) => formatFigure(r.figures[c] ?? null))]);
  const header = ['', ...columns];
  const widths = header.map((h, i) => Math.max(h.length, ...cells.map((line) => line[i]!.length)));
  const render = (line: readonly string[]) =>
    line
      .map((cell, i) => (i === 0 ? cell.padEnd(widths[i]!) : cell.padStart(widths[i]!)))
      .join('  ')
      .trimEnd();
  return [render(header), render(widths.map((w) => '-'.repeat(w))), ...cells.map(render)].join('\n');
}

/** The sections of an earlier out/bench.json, or none if it is missing or unreadable. */
function previousSections(file: string): { readonly name: string }[] {
  try {
    const sections: unknown = JSON.parse(readFileSync(file, 'utf8')).sections;
    return Array.isArray(sections) ? sections.filter((s): s is { name: string } => typeof s?.name === 'string') : [];
  } catch {
    return [];
  }
}

async function main(argv: readonly string[]): Promise<void> {
  const root = projectRoot();
  const unknown = argv.filter((name) => !SECTIONS.some((s) => s.name === name));
  if (unknown.length > 0) {
    console.error(`Expected one of ${SECTIONS.map((s) => s.name).join(', ')} for section but received ${unknown.join(', ')}`);
    process.exitCode = 2;
    return;
  }
  const chosen = argv.length === 0 ? SECTIONS : SECTIONS.filter((s) => argv.includes(s.name));
  const results: SectionResult[] = [];
  for (const section of chosen) {
    const notes: string[] = [];
    const t0 = performance.now();
    const rows = await section.run({ root, note: (text) => notes.push(text) });
    const seconds = (performance.now() - t0) / 1000;
    results.push({ name: section.name, title: section.title, rows, notes, seconds });
    console.log(`\n[${section.name}] ${section.title}\n`);
    console.log(formatTable(rows));
    for (const n of notes) console.log(`  note: ${n}`);
  }
  const outDir = path.join(root, 'out');
  mkdirSync(outDir, { recursive: true });
  const file = path.join(outDir, 'bench.json');
  // A run of some sections keeps the other sections' last figures (each carries its own date).
  const date = new Date().toISOString();
  const kept = argv.length === 0 ? [] : previousSections(file).filter((s) => !results.some((r) => r.name === s.name));
  const report = {
    date,
    node: process.version,
    cpu: cpus()[0]?.model ?? 'unknown',
    cores: cpus().length,
    sections: [...results.map((r) => ({ ...r, date })), ...kept],
  };
  writeFileSync(`${file}.tmp`, JSON.stringify(report, null, 2) + '\n');
  renameSync(`${file}.tmp`, file);
  console.log(`\nwrote ${path.relative(process.cwd(), file) || file}`);
}

await main(process.argv.slice(2));
