/**
 * Runs diagramColumns over all columns, split into blocks among worker
 * threads (or in this thread for one worker), and returns the ink row-major.
 * Block order and worker count never change the result (see
 * density-diagram.ts).
 */
import { mapOnWorkers } from '../threads/map-on-workers.js';
import { diagramColumns, type DiagramSettings, type ParameterAxis } from './density-diagram.js';
import { builtWorkerUrl } from '../threads/built-worker.js';
import type { UnimodalFamily } from './unimodal-family.js';

/** One block of diagram columns, as sent to a diagram worker (src/workers/diagram-worker.ts). */
export interface DiagramJob {
  family: string;
  axis: ParameterAxis;
  settings: DiagramSettings;
  col0: number;
  col1: number;
}

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
  await mapOnWorkers<DiagramJob, { col0: number; out: Uint16Array }>(
    builtWorkerUrl('diagram-worker'),
    blocks.length,
    (i) => ({ message: { family: family.name, axis, settings, col0: blocks[i]![0], col1: blocks[i]![1] } }),
    workers,
    (_, m) => {
      place(m.col0, m.out);
      onProgress?.(++done, blocks.length);
    },
  );
  return image;
}
