/**
 * The part of fontkit 2 that src/figure uses (fontkit ships no types):
 * opening a TrueType file, laying out a string and reading glyph outlines.
 */
declare module 'fontkit' {
  export interface PathCommand {
    readonly command: 'moveTo' | 'lineTo' | 'quadraticCurveTo' | 'bezierCurveTo' | 'closePath';
    readonly args: readonly number[];
  }
  export interface Path {
    readonly commands: readonly PathCommand[];
  }
  export interface Glyph {
    readonly id: number;
    readonly path: Path;
    readonly advanceWidth: number;
  }
  export interface GlyphPosition {
    readonly xAdvance: number;
    readonly yAdvance: number;
    readonly xOffset: number;
    readonly yOffset: number;
  }
  export interface GlyphRun {
    readonly glyphs: readonly Glyph[];
    readonly positions: readonly GlyphPosition[];
  }
  export interface Font {
    readonly unitsPerEm: number;
    readonly ascent: number;
    readonly descent: number;
    readonly postscriptName: string;
    layout(text: string): GlyphRun;
    hasGlyphForCodePoint(codePoint: number): boolean;
  }
  export function openSync(path: string): Font;
  export function create(buffer: Uint8Array): Font;
}
