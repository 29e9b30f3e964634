/**
 * quadatlas as a library: the public API (re-exports only).
 */
export { UserError } from './cli/user-error.js';
export { renderSheet, plateMetadata, type PlateSummary, type RenderSheetOptions } from './cli/render-sheet.js';
export { parseSheet, renderRecord, type Sheet } from './view/sheet.js';
export { doubleGrid, fitsDouble, pixelToC, type DoubleGrid, type View } from './view/view.js';
export { planStrips, type Strip, type Tile } from './view/tile-plan.js';
export { renderPlate, type PlateSinks, type RenderOptions } from './render/render-plate.js';
export { renderTile, createTileScratch } from './render/render-tile.js';
export type { PlateJob, TileStats } from './render/plate-job.js';
export { sampleParameters, DEFAULT_ESCAPE_RADIUS } from './plane/sample-parameters.js';
export { createSampleSet, type SampleSet, type EscapeSettings } from './plane/sample-set.js';
export { escapeLoop, createLoopOut, type EscapeLoop, type LoopOut } from './plane/escape-loop.js';
export { loadWasmEscapeLoop } from './plane/escape-loop-wasm.js';
export { attractingCycle } from './plane/attracting-cycle.js';
export { interiorDistance } from './plane/interior-distance.js';
export { exteriorDistance } from './plane/exterior-distance.js';
export { DEFAULT_COLOUR_SETTINGS, parseColourSettings, type ColourSettings } from './colour/colour-settings.js';
export { shadeSamples } from './colour/shade-samples.js';
export { encodePixels } from './colour/encode-pixels.js';
export { periodHex, periodLinear } from './colour/period-palette.js';
export { openPngSink } from './io/png-sink.js';
export { openTiffSink } from './io/tiff-sink.js';
export { openNpySink } from './io/npy-sink.js';
export { readPlateMetadata } from './io/plate-metadata.js';
export type { RasterSink, RasterSpec } from './io/raster-sink.js';
