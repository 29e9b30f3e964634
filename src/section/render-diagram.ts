/**
 * Runs diagramColumns over all columns, split into blocks among worker
 * threads (or in this thread for one worker), and returns the ink row-major.
 * Block order and worker count never change the result (see
 * density-diagram.ts).
 */
import { Worker } from 'node:worker_threads';
import { diagramColumns, type DiagramSettings, type ParameterAxis } from './density-diagram.js';
import type { DiagramJob } from './diagram-worker.js';
import type { UnimodalFamily } from './unimodal-family.js';

const BLOCK = 32;

/** Row-major 16-bit ink (width x height). */
export async function renderDiagram(
  family: UnimodalFamily,
  axis: ParameterAxis,
  settings: DiagramSettings,
  workers: number,
  onProgress?: (done: number, total: number) => void,
): Promise<Uint16Array> {
  const { width, height } = settings;
  const image = new Uint16Array(width * height);
  const place = (col0: number, cols: Uint16Array): void => {
    const n = cols.length / height;
    for (let c = 0; c < n; c++) for (let j = 0; j < height; j++) image[j * width + col0 + c] = cols[c * height + j]!;
  };
  const blocks: [number, number][] = [];
  for (let c = 0; c < width; c += BLOCK) blocks.push([c, Math.min(width, c + BLOCK)]);
  let done = 0;
  if (workers <= 1) {
    const acc = new Float64Array(height);
    for (const [a, b] of blocks) {
      place(a, diagramColumns(family, axis, settings, a, b, new Uint16Array((b - a) * height), acc));
      onProgress?.(++done, blocks.length);
    }
    return image;
  }
  const url = new URL('./diagram-worker.js', import.meta.url);
  const pool = Array.from({ length: Math.min(workers, blocks.length) }, () => new Worker(url));
  let next = 0;
  try {
    await Promise.all(
      pool.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            const send = (): void => {
              if (next >= blocks.length) return resolve();
              const [col0, col1] = blocks[next++]!;
              const job: DiagramJob = { family: family.name, axis, settings, col0, col1 };
              w.postMessage(job);
            };
            w.on('message', (m: { col0: number; out: Uint16Array }) => {
              place(m.col0, m.out);
              onProgress?.(++done, blocks.length);
              send();
            });
            w.on('error', reject);
            send();
          }),
      ),
    );
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
  return image;
}
