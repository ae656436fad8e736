// The colours of waveplan's pictures: a warm paper ground, an ink-blue staircase for what the DAC
// really emits, a copper dashed line for the ideal signal, brick red for anything broken.
export const palette = {
  paper: '#fbf8f1',
  plot: '#ffffff',
  grid: '#e8e2d3',
  axis: '#6b6453',
  label: '#3d382c',
  muted: '#8c8574',
  samples: '#1d4e89',
  samplesFill: '#9db8d9',
  ideal: '#c46d1c',
  rail: '#b9ae94',
  fault: '#b23a2e',
  ok: '#3c7a3a',
  longPeriod: '#7b4fa0',
  shortPeriod: '#4f8fa0',
} as const;
