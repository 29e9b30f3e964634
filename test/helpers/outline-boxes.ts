/**
 * Text drawn as outlines in an SVG (figure/outline-lettering.ts and the
 * figure SVG writer): each `<path role="img" [class] aria-label d>` with the
 * box of its ink, read from the path's own coordinates (every number pair of
 * M, L, Q and C; control points only widen the box, by less than the
 * glyphs' overshoot). Rotated outlines report their box before rotation.
 */
export interface Outline {
  readonly cls: string;
  readonly label: string;
  readonly rotated: boolean;
  readonly x0: number;
  readonly x1: number;
  readonly y0: number;
  readonly y1: number;
}

function unescape(s: string): string {
  return s
    .replace(/&quot;/g, '"')
    .replace(/&gt;/g, '>')
    .replace(/&lt;/g, '<')
    .replace(/&amp;/g, '&');
}

export function outlines(svg: string): Outline[] {
  const found: Outline[] = [];
  for (const m of svg.matchAll(/<path role="img"((?: [a-z-]+="[^"]*")*)\/>/g)) {
    const attrs = new Map([...m[1]!.matchAll(/ ([a-z-]+)="([^"]*)"/g)].map((a) => [a[1]!, a[2]!]));
    const nums = (attrs.get('d') ?? '').match(/-?\d+(?:\.\d+)?/g)?.map(Number) ?? [];
    let x0 = Infinity;
    let x1 = -Infinity;
    let y0 = Infinity;
    let y1 = -Infinity;
    for (let i = 0; i + 1 < nums.length; i += 2) {
      x0 = Math.min(x0, nums[i]!);
      x1 = Math.max(x1, nums[i]!);
      y0 = Math.min(y0, nums[i + 1]!);
      y1 = Math.max(y1, nums[i + 1]!);
    }
    found.push({ cls: attrs.get('class') ?? '', label: unescape(attrs.get('aria-label') ?? ''), rotated: attrs.has('transform'), x0, x1, y0, y1 });
  }
  return found;
}

/** True when the two boxes share interior. */
export function overlaps(a: Outline, b: Outline): boolean {
  return a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;
}
