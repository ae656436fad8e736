// The pictures of a plan, as SVG text. Pure functions: plan figures in, markup out.
export { waveformSvg } from './waveform';
export { seamSvg } from './seam';
export { jitterSvg } from './jitter';
export { svgDataUri } from './datauri';
export { memorySvg, type MemorySegment } from './memory';
