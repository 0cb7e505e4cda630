import { useRouteLoaderData } from "react-router";
import type { loader as rootLoader } from "~/root";

/** The visitor's compare list, as the root loader read it from the cookie (empty before it has). */
export function useCompareList(): string[] {
  return useRouteLoaderData<typeof rootLoader>("root")?.compare ?? [];
}
