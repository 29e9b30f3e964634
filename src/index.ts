/**
 * quadatlas as a library: the public API (re-exports only).
 */
export { UserError } from './check/user-error.js';
export { renderSheet, plateMetadata, type PlateSummary, type RenderSheetOptions } from './render/render-sheet.js';
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

// Components by number.
export { findNucleus, type ComplexDecimal } from './components/nucleus.js';
export { findBoundaryPoint } from './components/boundary-point.js';
export { sizeEstimate } from './components/size-estimate.js';
export { census, type CensusComponent, type CensusResult } from './components/census.js';
export { CensusStatisticsAccumulator, satelliteParentPeriod, componentAreaEstimate, type CensusStatistics, type SizeBin } from './components/census-statistics.js';
export { shardAngleRange } from './components/census-shard.js';
export { componentsInBox, type BoxedNucleus } from './components/components-in-box.js';
export { componentInfo, type ComponentInfo } from './components/component-info.js';
export { lavaursPairs, type AnglePair } from './components/lavaurs.js';
export { kneadingSequence, internalAddress, addressOfAngle } from './components/internal-address.js';
export { parseAngle, type Angle } from './components/external-angle.js';
export { findMisiurewicz } from './components/misiurewicz.js';
export { misiurewiczCount, refineMisiurewicz, type MisiurewiczPoint } from './components/misiurewicz-points.js';
export { listMisiurewicz, type MisiurewiczListing } from './components/misiurewicz-list.js';

// The real slice.
export { cToR, rToC, xToZ, zToX } from './section/conjugacy.js';
export { FAMILIES, logistic, sine, quartic } from './section/families/index.js';
export type { UnimodalFamily } from './section/unimodal-family.js';
export { computeCascade, type Cascade, type CascadeLevel } from './section/cascade.js';
export { cascadeSolverFor } from './section/cascade-solver-for.js';
export { findWindows, type PeriodicWindow } from './section/windows.js';
export { windowOf } from './section/window-of.js';
export { mssWords } from './section/kneading.js';
export { lyapunovExponents } from './section/lyapunov.js';
export { agreeingDigits, constantsAt, constantsPlan, type ConstantsAt, type ConstantsPlan } from './section/constants/feigenbaum-constants.js';
export { fixedPointDefect, solveFixedPoint, type FixedPointSolution } from './section/constants/fixed-point.js';
export { kneadingSequence as criticalKneading, topologicalEntropy, type Entropy, type Kneading } from './section/entropy.js';
export { doubledWord, parseWindowWord, windowSolver } from './section/window-cascade.js';

// Deep arithmetic.
export { computeReferenceOrbit, referenceBits, type ReferenceOrbit } from './precise/reference-orbit.js';
export { buildBlaTable, type BlaTable } from './plane/deep/bla-table.js';
export { sampleDeep, type DeepSettings } from './plane/deep/sample-deep.js';
export { deepPlan } from './plane/deep/plan.js';
export { prepareDeepJob, type DeepJob } from './plane/deep/job.js';

// The dynamical plane of one c, and orbits of the real slice.
export { findJuliaCycle, type JuliaCycle } from './dynamic/julia-cycle.js';
export { juliaTrap } from './dynamic/julia-trap.js';
export { sampleJulia, createJuliaSampleSet, type JuliaSampleSet, type JuliaTrap, type JuliaSettings } from './dynamic/sample-julia.js';
export { sampleJuliaDeep, type JuliaReferences } from './dynamic/sample-julia-deep.js';
export { dynamicRay } from './dynamic/dynamic-ray.js';
export { fixedPoints } from './dynamic/fixed-points.js';
export { parabolicPetals, type ParabolicPetals } from './dynamic/parabolic-petals.js';
export { computeJuliaReference } from './precise/julia-reference-orbit.js';
export { parseJuliaSheet, type JuliaSheet } from './view/julia-sheet.js';
export { orbit, classifyOrbit, type OrbitClass } from './section/orbit.js';
export { preciseOrbit, type PreciseOrbit } from './section/precise-orbit.js';
export { orbitPlotSvg, cobwebSvg } from './section/orbit-figures.js';

// Figures: annotations in c coordinates and their PDF and SVG writers.
export { axisTicks, type AxisTicks, type Tick } from './figure/axis-ticks.js';
export { figureModel, type FigureModel, type FigureOptions, type FigureCurve } from './figure/figure-model.js';
export { layoutFigure } from './figure/layout-figure.js';
export type { FigureScene } from './figure/figure-scene.js';
export { figureFont, type FigureFont } from './figure/figure-font.js';
export { figurePdf } from './figure/write-figure-pdf.js';
export { figureSvg } from './figure/write-figure-svg.js';
export { parameterRay, type ParameterRay } from './figure/parameter-rays.js';
export { outlinesInView, type ComponentOutline } from './figure/component-outlines.js';
export { componentOutline } from './components/component-outline.js';
