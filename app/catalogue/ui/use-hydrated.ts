import { useEffect, useState } from "react";

/**
 * False in the server's HTML and the first render; true once the page's JavaScript runs. The flip
 * re-renders whatever calls it, so only the small parts that differ without JavaScript call it, never
 * a component above the cards or the panel (a second render of the whole market is a long task on a phone).
 */
export function useHydrated(): boolean {
  const [hydrated, setHydrated] = useState(false);
  useEffect(() => setHydrated(true), []);
  return hydrated;
}
