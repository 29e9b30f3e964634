// The period-doubling cascade of the logistic map: superstable parameters
// of periods 1, 2, 4, ... 2^10 and the Feigenbaum delta estimated from them.
import { cascadeSolverFor, computeCascade, logistic } from 'quadatlas';

const digits = 30;
const { solver } = cascadeSolverFor(logistic, digits);
const cascade = computeCascade(solver, 10, digits);
for (const level of cascade.levels) {
  console.log(`period ${String(level.period).padStart(4)}  r = ${level.superstable.toFixed(20)}  delta_n = ${level.delta?.toFixed(10) ?? '-'}`);
}
console.log(`delta ~ ${cascade.delta.value.toPrecision(Math.max(1, cascade.delta.digits))} (${cascade.delta.digits} significant digits trusted)`);
