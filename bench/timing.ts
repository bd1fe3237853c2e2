/** Small timing helpers for benchmarks (wall clock, milliseconds). */
export function timeIt(fn: () => unknown): number {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

export async function timeItAsync(fn: () => Promise<unknown>): Promise<number> {
  const t0 = performance.now();
  await fn();
  return performance.now() - t0;
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
