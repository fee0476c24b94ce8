/** A small seeded generator (mulberry32) so the demo scenario is the same on every machine. */
export function seeded(seed: number): { next: () => number; normal: (mean: number, sd: number) => number; pick: <T>(xs: T[]) => T } {
  let a = seed >>> 0;
  const next = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  // Box–Muller transform
  const normal = (mean: number, sd: number): number => mean + sd * Math.sqrt(-2 * Math.log(1 - next())) * Math.cos(2 * Math.PI * next());
  const pick = <T>(xs: T[]): T => xs[Math.floor(next() * xs.length)]!;
  return { next, normal, pick };
}
