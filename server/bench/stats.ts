// Benchmark figures are medians of several runs with their spread (this machine's speed drifts).
export const median = (xs: number[]): number => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
export const spread = (xs: number[], digits = 0): string => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;
