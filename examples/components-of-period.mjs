// Every hyperbolic component of period 5: count them, then polish one
// nucleus to 40 digits after the decimal point.
import { census, componentInfo, findNucleus } from 'quadatlas';

const period = 5;
const { components } = await census(period, { workers: 1 });
console.log(`period ${period}: ${components.length} components, ${components.filter((c) => c.real).length} on the real axis`);

// The real one furthest left, from the census's double-double nucleus.
const left = components.filter((c) => c.real).sort((a, b) => a.reHi - b.reHi)[0];
const { nucleus } = findNucleus(period, { re: String(left.reHi), im: '0' }, 40);
console.log(`leftmost real nucleus: ${nucleus.re}`);
const info = await componentInfo(period, nucleus, 40);
console.log(`shape ${info.shape}, size ${info.size.toPrecision(6)}, external angles ${info.angles?.map((a) => `${a.num}/${a.den}`).join(', ')}`);
