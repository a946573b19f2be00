import { useEffect, useState } from 'react';

/**
 * False in the server-rendered HTML and until the island has hydrated. Forms keep their submit
 * button disabled until then, so a click before the script runs cannot submit natively
 * (which would put the typed password in the address bar and do nothing).
 */
export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}
