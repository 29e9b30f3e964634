/**
 * The real slice: time and trusted digits of Feigenbaum's delta and alpha
 * from the logistic cascade (16 levels, periods up to 65536), checked
 * against OEIS A006890 / A006891; and the time of a 4000 x 2000 density
 * diagram with 4 parameter samples per column on all cores.
 */
import { availableParallelism } from 'node:os';
import { Decimal } from 'decimal.js';
import { computeCascade } from '../src/section/cascade.js';
import { cascadeSolverFor } from '../src/section/cascade-solver-for.js';
import { logistic } from '../src/section/families/index.js';
import { renderDiagram } from '../src/section/render-diagram.js';
import type { BenchRow, BenchSection } from './bench-section.js';

// OEIS A006890 and A006891 (Briggs 1991).
const DELTA = '4.669201609102990671853203820466201617258';
const ALPHA = '2.502907875095892822283902873218215786381';

/** Leading significant digits of `value` that agree with `truth`. */
function correctDigits(value: Decimal, truth: string): number {
  const t = new Decimal(truth);
  const err = value.minus(t).abs();
  return err.isZero() ? 40 : Math.max(0, Math.floor(-err.div(t).log(10).toNumber()));
}

export const sliceSection: BenchSection = {
  name: 'section',
  title: 'Feigenbaum delta and alpha from 16 cascade levels; a 4000 x 2000 diagram at 4 samples per column',
  async run(context) {
    const rows: BenchRow[] = [];
    computeCascade(cascadeSolverFor(logistic, 30).solver, 8, 30); // warm-up
    const t0 = performance.now();
    const c = computeCascade(cascadeSolverFor(logistic, 46).solver, 16, 46);
    const seconds = (performance.now() - t0) / 1000;
    rows.push({ label: 'delta, 16 levels', figures: { seconds, trusted: c.delta.digits, correct: correctDigits(c.delta.value, DELTA), workers: 1 } });
    rows.push({ label: 'alpha, 16 levels', figures: { seconds, trusted: c.alpha.digits, correct: correctDigits(c.alpha.value, ALPHA), workers: 1 } });
    const workers = availableParallelism();
    const settings = { width: 4000, height: 2000, samples: 4, transient: 1000, iterations: 4000, stateTop: 1, stateBottom: 0 };
    const t1 = performance.now();
    await renderDiagram(logistic, { kind: 'parameter', from: 2.8, to: 4 }, settings, workers);
    rows.push({ label: 'diagram 4000x2000, 4 samples/column', figures: { seconds: (performance.now() - t1) / 1000, trusted: null, correct: null, workers } });
    context.note(
      `delta ${c.delta.value.toPrecision(Math.max(1, c.delta.digits))}, alpha ${c.alpha.value.toPrecision(Math.max(1, c.alpha.digits))}; diagram: 1000 transient + 4000 plotted steps per sample`,
    );
    return rows;
  },
};
