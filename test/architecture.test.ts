// The layer order of docs/architecture.md, held: no file imports from a higher
// layer, nothing but cli/ imports cli/, and no two files import each other,
// directly or around a loop. Imports are read from the sources as text
// (static `import ... from` and `export ... from`, and dynamic `import()`).
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from './helpers/run-cli.js';

const SRC = path.join(ROOT, 'src');

function layerOrder(): string[] {
  const doc = readFileSync(path.join(ROOT, 'docs/architecture.md'), 'utf8');
  const block = /```layers\n([\s\S]*?)```/.exec(doc);
  if (block === null) throw new Error('docs/architecture.md has no ```layers block');
  return block[1]!
    .split('\n')
    .map((l) => l.trim())
    .filter((l) => l !== '');
}

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(full));
    else if (e.name.endsWith('.ts') && !e.name.endsWith('.d.ts')) out.push(full);
  }
  return out;
}

/** Relative imports of a file, resolved to .ts paths; `dynamic` marks import() (lazy loading). */
function importsOf(file: string): Array<{ target: string; dynamic: boolean }> {
  const text = readFileSync(file, 'utf8')
    .replace(/\/\*[\s\S]*?\*\//g, '')
    .replace(/^\s*\/\/.*$/gm, '');
  const found: Array<{ target: string; dynamic: boolean }> = [];
  const add = (spec: string, dynamic: boolean): void => {
    if (!spec.startsWith('.')) return;
    found.push({ target: path.resolve(path.dirname(file), spec).replace(/\.js$/, '.ts'), dynamic });
  };
  for (const m of text.matchAll(/^\s*(?:import|export)\s[^;]*?from\s+['"]([^'"]+)['"]/gm)) add(m[1]!, false);
  for (const m of text.matchAll(/\bimport\(\s*['"]([^'"]+)['"]\s*\)/g)) add(m[1]!, true);
  return found;
}

/** The layer folder of a source file: its first folder under src/ ('' for src/index.ts and other top-level files). */
function folderOf(file: string): string {
  const rel = path.relative(SRC, file).split(path.sep);
  return rel.length === 1 ? '' : rel[0]!;
}

describe('docs/architecture.md layer order', () => {
  const order = layerOrder();
  const files = sourceFiles(SRC);

  it('names every folder of src/ exactly once', () => {
    const folders = [...new Set(files.map(folderOf).filter((f) => f !== ''))].sort();
    expect(new Set(order).size).toBe(order.length);
    for (const f of folders) expect(order, `src/${f} is not in the layer order`).toContain(f);
  });

  it('every import points to the same or a lower layer; only cli/ imports cli/', () => {
    const rank = new Map(order.map((f, i) => [f, i]));
    const upward: string[] = [];
    for (const file of files) {
      const from = folderOf(file);
      for (const { target } of importsOf(file)) {
        const to = folderOf(target);
        const rel = `${path.relative(ROOT, file)} -> ${path.relative(ROOT, target)}`;
        if (from === '') {
          if (to === 'cli') upward.push(`${rel} (the library entry point exports nothing from cli/)`);
          continue;
        }
        if (to === '') {
          upward.push(`${rel} (a layer imports the entry point)`);
          continue;
        }
        if ((rank.get(to) ?? -1) > (rank.get(from) ?? -1)) upward.push(`${rel} (${from} below ${to})`);
      }
    }
    expect(upward).toEqual([]);
  });

  it('every relative import names a file that exists', () => {
    const missing: string[] = [];
    for (const file of files) for (const { target } of importsOf(file)) if (!existsSync(target)) missing.push(`${path.relative(ROOT, file)} -> ${path.relative(ROOT, target)}`);
    expect(missing).toEqual([]);
  });

  it('no import cycle between files (static imports; lazy import() excluded)', () => {
    const graph = new Map<string, string[]>();
    for (const file of files)
      graph.set(
        file,
        importsOf(file)
          .filter((i) => !i.dynamic && graph !== null)
          .map((i) => i.target),
      );
    // Tarjan's strongly connected components: any component of more than one file is a cycle.
    let index = 0;
    const idx = new Map<string, number>();
    const low = new Map<string, number>();
    const stack: string[] = [];
    const on = new Set<string>();
    const cycles: string[][] = [];
    const visit = (v: string): void => {
      idx.set(v, index);
      low.set(v, index);
      index++;
      stack.push(v);
      on.add(v);
      for (const w of graph.get(v) ?? []) {
        if (!graph.has(w)) continue;
        if (!idx.has(w)) {
          visit(w);
          low.set(v, Math.min(low.get(v)!, low.get(w)!));
        } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
      }
      if (low.get(v) === idx.get(v)) {
        const comp: string[] = [];
        let w: string;
        do {
          w = stack.pop()!;
          on.delete(w);
          comp.push(path.relative(ROOT, w));
        } while (w !== v);
        if (comp.length > 1) cycles.push(comp.sort());
      }
    };
    for (const f of files) if (!idx.has(f)) visit(f);
    expect(cycles).toEqual([]);
  });

  it('an upward import or a cycle is caught (the checks on a made-up tree)', () => {
    // Negative control for the reader: an import line of each form is found.
    const sample = path.join(SRC, 'plane', 'x.ts');
    const text = "import { a } from '../cli/a.js';\nexport { b } from './b.js';\nconst c = await import('../render/c.js');";
    const specs = [...text.matchAll(/^\s*(?:import|export)\s[^;]*?from\s+['"]([^'"]+)['"]/gm)].map((m) => m[1]);
    const lazy = [...text.matchAll(/\bimport\(\s*['"]([^'"]+)['"]\s*\)/g)].map((m) => m[1]);
    expect(specs).toEqual(['../cli/a.js', './b.js']);
    expect(lazy).toEqual(['../render/c.js']);
    expect(folderOf(path.resolve(path.dirname(sample), '../cli/a.ts'))).toBe('cli');
  });
});
