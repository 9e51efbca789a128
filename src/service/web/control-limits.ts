/**
 * Control limits of a series of deviations, as in statistical process control of QA results:
 * centre line the mean, limits mean ± 3σ (σ the sample standard deviation). Undefined σ below two values.
 */
export function controlLimits(values: readonly number[]): { mean: number; sigma: number; lower: number; upper: number } | undefined {
  if (values.length === 0) return undefined;
  const mean = values.reduce((s, v) => s + v, 0) / values.length;
  if (values.length < 2) return undefined;
  const sigma = Math.sqrt(values.reduce((s, v) => s + (v - mean) ** 2, 0) / (values.length - 1));
  return { mean, sigma, lower: mean - 3 * sigma, upper: mean + 3 * sigma };
}
