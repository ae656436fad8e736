// The waveform shapes a table can hold; the wave schema's `shape` key takes exactly these.
export const SHAPES = ['sine', 'square', 'triangle', 'sawtooth'] as const;
export type Shape = (typeof SHAPES)[number];
