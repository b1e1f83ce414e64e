import { useEffect, useState } from 'react';

/**
 * False in the server-rendered HTML and until the island has hydrated. Submit
 * buttons stay disabled until then, so a fast click never sends a form the
 * browser's own way (which would put a password in the address bar).
 */
export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}
