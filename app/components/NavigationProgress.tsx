import { useNavigation } from "react-router";

/**
 * A slim bar across the top while the next page loads, so a slow network never leaves the page looking
 * frozen. It waits a moment before showing (a quick page should not flash it) and then creeps towards
 * the end without reaching it; the page's `aria-busy` tells screen readers the same.
 */
export function NavigationProgress() {
  const navigation = useNavigation();
  if (navigation.state === "idle") return null;
  return (
    <div aria-hidden="true" className="pointer-events-none fixed inset-x-0 top-0 z-50 h-[3px]">
      <div className="navigation-progress h-full origin-left bg-walnut shadow-[0_0_6px_rgb(106_65_39/0.5)]" />
    </div>
  );
}

/** Whether a page is on its way (for `aria-busy` on the page's main region). */
export function useNavigating(): boolean {
  return useNavigation().state !== "idle";
}
