// AssemblyScript source of the 8-bit sRGB encoder's fast path (compiled by
// scripts/build-wasm.mjs; the extension is .as so that tsc leaves it alone).
//
// The same arithmetic as encode8 in src/colour/encode-pixels.ts, operation
// for operation, on 4 channels at a time: the dither hash in one i32x4, the
// table estimate of the transfer curve and the rounding test in two f64x2
// (sqrt, mul, add, floor are IEEE operations in WebAssembly as in JS, and
// there is no fused multiply-add), so a channel it settles gets the byte the
// JS loop gives. A channel it cannot settle (a rounding the table leaves in
// doubt, the linear toe, the short stretch just below white) is listed in
// DOUBT and left to the JS loop, which uses the exact curve (Math.pow).

const CAPACITY: i32 = 49152;
const TABLE_LENGTH: i32 = 4098;

const LINEAR: usize = memory.data(CAPACITY * 8, 16);
const SEEDS: usize = memory.data(CAPACITY * 4, 16);
const OUT: usize = memory.data(CAPACITY + 16, 16);
const DOUBT: usize = memory.data(CAPACITY * 4, 16);
const TABLE: usize = memory.data(TABLE_LENGTH * 8, 16);

const POWER_FROM: f64 = 0.0031308;
const BELOW_WHITE: f64 = 0.999;
const SIZE: f64 = 4096;

export function capacity(): i32 { return CAPACITY; }
export function linearPointer(): usize { return LINEAR; }
export function seedsPointer(): usize { return SEEDS; }
export function outPointer(): usize { return OUT; }
export function doubtPointer(): usize { return DOUBT; }
export function tablePointer(): usize { return TABLE; }
export function tableLength(): i32 { return TABLE_LENGTH; }

/** The table estimate of one lane, srgbEstimate of encode-pixels.ts: k = trunc(sqrt(v) * 4096), a + (x - k) (T[k+1] - a). */
@inline function estimate(x: f64): f64 {
  const k = <i32>x;
  const p = TABLE + (<usize>k << 3);
  const a = load<f64>(p);
  return a + (x - <f64>k) * (load<f64>(p, 8) - a);
}

/** lowbias32 (mixBits of encode-pixels.ts) on four lanes. */
@inline function mix(x: v128): v128 {
  x = v128.xor(x, i32x4.shr_u(x, 16));
  x = i32x4.mul(x, i32x4.splat(0x7feb352d));
  x = v128.xor(x, i32x4.shr_u(x, 15));
  x = i32x4.mul(x, i32x4.splat(<i32>0x846ca68b));
  return v128.xor(x, i32x4.shr_u(x, 16));
}

/**
 * Encodes `rows` rows of `width` pixels (3 channels each) from LINEAR into
 * OUT; SEEDS holds the per-column seeds s(x, ch) of the tile (encode-pixels.ts),
 * y0 the absolute row of the first row. Returns how many channel indices
 * it wrote to DOUBT.
 */
export function encode8(width: i32, rows: i32, y0: i32, slack: f64): i32 {
  const n3 = 3 * width;
  const half = f64x2.splat(0.5);
  const sl = f64x2.splat(slack);
  const lowBound = f64x2.splat(POWER_FROM);
  const highBound = f64x2.splat(BELOW_WHITE);
  const one = f64x2.splat(1);
  const zero = f64x2.splat(0);
  const size = f64x2.splat(SIZE);
  const max = f64x2.splat(255);
  const unit = f64x2.splat(1.0 / 65536);
  const low16 = i32x4.splat(0xffff);
  let doubts = 0;
  for (let j = 0; j < rows; j++) {
    const yv = i32x4.splat(y0 + j);
    const rowStart = j * n3;
    for (let c = 0; c < n3; c += 4) {
      const p = rowStart + c;
      const h = mix(v128.xor(v128.load(SEEDS + (<usize>c << 2)), yv));
      const d = i32x4.sub(v128.and(h, low16), i32x4.shr_u(h, 16));
      const s0 = f64x2.mul(f64x2.convert_low_i32x4_s(d), unit);
      const s1 = f64x2.mul(f64x2.convert_low_i32x4_s(i32x4.shuffle(d, d, 2, 3, 0, 1)), unit);
      const v0 = v128.load(LINEAR + (<usize>p << 3));
      const v1 = v128.load(LINEAR + (<usize>p << 3), 16);
      const x0 = f64x2.mul(f64x2.sqrt(v0), size);
      const x1 = f64x2.mul(f64x2.sqrt(v1), size);
      // Lanes outside the power segment may hold any value (NaN, negative, above 1): index 0 keeps the loads in the table.
      const in0 = v128.and(f64x2.gt(v0, lowBound), f64x2.lt(v0, highBound));
      const in1 = v128.and(f64x2.gt(v1, lowBound), f64x2.lt(v1, highBound));
      const xs0 = v128.and(x0, in0);
      const xs1 = v128.and(x1, in1);
      const e0 = f64x2.add(f64x2.mul(f64x2.replace_lane(f64x2.splat(estimate(f64x2.extract_lane(xs0, 0))), 1, estimate(f64x2.extract_lane(xs0, 1))), max), s0);
      const e1 = f64x2.add(f64x2.mul(f64x2.replace_lane(f64x2.splat(estimate(f64x2.extract_lane(xs1, 0))), 1, estimate(f64x2.extract_lane(xs1, 1))), max), s1);
      const lo0 = f64x2.sub(e0, sl);
      const lo1 = f64x2.sub(e1, sl);
      const q0 = f64x2.floor(f64x2.add(lo0, half));
      const q1 = f64x2.floor(f64x2.add(lo1, half));
      const sure0 = v128.and(v128.and(in0, f64x2.ge(lo0, half)), f64x2.eq(q0, f64x2.floor(f64x2.add(f64x2.add(e0, sl), half))));
      const sure1 = v128.and(v128.and(in1, f64x2.ge(lo1, half)), f64x2.eq(q1, f64x2.floor(f64x2.add(f64x2.add(e1, sl), half))));
      const white0 = f64x2.ge(v0, one);
      const white1 = f64x2.ge(v1, one);
      const black0 = v128.not(f64x2.gt(v0, zero));
      const black1 = v128.not(f64x2.gt(v1, zero));
      // q is at least 1 here (lo >= 1/2) and at most 256: clip to 255 as encode8 does.
      let b0 = v128.bitselect(f64x2.min(q0, max), zero, sure0);
      let b1 = v128.bitselect(f64x2.min(q1, max), zero, sure1);
      b0 = v128.bitselect(max, b0, white0);
      b1 = v128.bitselect(max, b1, white1);
      const bytes = i32x4.trunc_sat_f64x2_s_zero(b0);
      const bytes1 = i32x4.trunc_sat_f64x2_s_zero(b1);
      const o = OUT + <usize>p;
      store<u8>(o, <u8>i32x4.extract_lane(bytes, 0));
      store<u8>(o, <u8>i32x4.extract_lane(bytes, 1), 1);
      store<u8>(o, <u8>i32x4.extract_lane(bytes1, 0), 2);
      store<u8>(o, <u8>i32x4.extract_lane(bytes1, 1), 3);
      const settled = i64x2.bitmask(v128.or(v128.or(sure0, white0), black0)) | (i64x2.bitmask(v128.or(v128.or(sure1, white1), black1)) << 2);
      if (settled != 15) {
        for (let l = 0; l < 4; l++) {
          if ((settled & (1 << l)) == 0 && c + l < n3) {
            store<i32>(DOUBT + (<usize>doubts << 2), p + l);
            doubts++;
          }
        }
      }
    }
  }
  return doubts;
}
