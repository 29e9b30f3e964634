/**
 * A figure laid out on the page: what the PDF and SVG writers draw, in
 * points (1/72 in), origin at the top left, y downwards. Writers do no
 * geometry beyond this: every text item has its baseline start resolved.
 */
export interface Rect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface SceneText {
  readonly text: string;
  /** Start of the baseline (before rotation, the rotation is about this point). */
  readonly x: number;
  readonly y: number;
  /** Font size in points. */
  readonly size: number;
  /** 0, or -90 for text read upwards (the Im axis title). */
  readonly rotate: 0 | -90;
  /** What the text is, for readers of the SVG and the --json summary: 're-tick', 'im-tick', 'title', 'caption', 'ray'. */
  readonly role: string;
  /** sRGB hex fill. */
  readonly colour: string;
}

export interface SceneStroke {
  /** x0, y0, x1, y1, ... in points. */
  readonly points: readonly number[];
  readonly width: number;
  /** sRGB hex, "#rrggbb". */
  readonly colour: string;
  /** Clipped to the plate's rectangle. */
  readonly clip: boolean;
}

/** A filled rectangle (the backing of a label drawn over the plate). */
export interface SceneFill extends Rect {
  readonly colour: string;
  readonly opacity: number;
}

export interface FigureScene {
  readonly width: number;
  readonly height: number;
  /** Where the raster plate goes. */
  readonly plate: Rect;
  readonly strokes: readonly SceneStroke[];
  /** Drawn after the strokes, before the texts. */
  readonly fills: readonly SceneFill[];
  readonly texts: readonly SceneText[];
  /** Indices into the model's marks of those that found room and were drawn. */
  readonly drawnMarks: readonly number[];
  /** The model's points inside the plate (indices), and whether each label found room. */
  readonly drawnPoints: ReadonlyArray<{ readonly index: number; readonly labelled: boolean }>;
}
