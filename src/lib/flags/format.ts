// Number wording for flag sentences.

export function watts(value: number): string {
  return `${value.toFixed(1)} W`;
}

export function milliampsPerWatt(value: number): string {
  return `${value.toFixed(2)} mA/W`;
}

export function percent(value: number): string {
  return `${Math.round(Math.abs(value))} %`;
}

/** Minutes with at most one decimal, so that 23.9 minutes does not read as 24. */
export function minutes(seconds: number): string {
  return String(Math.round((seconds / 60) * 10) / 10);
}

export function count(n: number, singular: string, plural = `${singular}s`): string {
  return `${n} ${n === 1 ? singular : plural}`;
}

export function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}
