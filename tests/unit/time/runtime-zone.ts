// Node re-reads TZ whenever process.env.TZ is assigned, so a test can run a
// function "in" a time zone without a separate process.
export function inZone<T>(zone: string, fn: () => T): T {
  const before = process.env.TZ;
  process.env.TZ = zone;
  try {
    return fn();
  } finally {
    if (before === undefined) delete process.env.TZ;
    else process.env.TZ = before;
  }
}
