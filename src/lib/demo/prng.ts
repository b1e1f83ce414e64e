// Seeded pseudo-random numbers for the demo data. Math.random cannot be
// seeded, and the demo must come out the same on every run and machine.

export type Random = () => number;

/** mulberry32: a 32-bit-state generator, uniform in [0, 1). Plenty for demo noise. */
export function mulberry32(seed: number): Random {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A seed named after what it is for (FNV-1a of the text), so that seeds do not depend on list order. */
export function seedOf(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash >>> 0;
}

/** Roughly standard normal (sum of four uniforms, rescaled): cheap, bounded at ±3.5. */
export function normal(random: Random): number {
  return (random() + random() + random() + random() - 2) * Math.sqrt(3);
}

/** Uniform in [lo, hi). */
export function between(random: Random, lo: number, hi: number): number {
  return lo + (hi - lo) * random();
}

/** One of the integers lo … hi, each equally likely. */
export function integerBetween(random: Random, lo: number, hi: number): number {
  return lo + Math.floor(random() * (hi - lo + 1));
}
