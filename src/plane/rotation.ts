// The one rotation helper of the package (views, deep geometry).

/** cos and sin of a rotation in degrees; exact quarter turns keep exact axes (no 6e-17 from cos(pi/2)). */
export function rotationCosSin(degrees: number): { cos: number; sin: number } {
  if (degrees % 90 === 0) {
    const q = (((degrees / 90) % 4) + 4) % 4;
    return { cos: [1, 0, -1, 0][q]!, sin: [0, 1, 0, -1][q]! };
  }
  const turn = (degrees * Math.PI) / 180;
  return { cos: Math.cos(turn), sin: Math.sin(turn) };
}
