// The one rounding rule: half away from zero (DEVELOPERS.md, "Parser
// decisions"), for stored figures, flag evidence and what the pages show.
export function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = (Math.sign(value) * Math.round(Math.abs(value) * f)) / f;
  return r === 0 ? 0 : r;
}
