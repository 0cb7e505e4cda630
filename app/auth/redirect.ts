// Where to send a browser after signing in. Only paths on this site are accepted, so a crafted
// `redirectTo` cannot bounce a freshly signed-in user to another site.
const AUTH_PAGES = ["/sign-in", "/sign-up", "/sign-out", "/forgot-password", "/reset-password", "/verify-email", "/auth/"];

const BASE = "https://loadline.invalid";

// Browsers read "//host" and "/\host" as another site, and drop tabs and newlines before parsing,
// so "/\t/host" is "//host" too.
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
const isLocalPath = (p: string) => p.startsWith("/") && p[1] !== "/" && p[1] !== "\\" && !CONTROL.test(p);

/**
 * A same-site path to go to, or `fallback`. The target is resolved first (dot segments such as
 * "/.//host" collapse to "//host") and the result is checked again, also once percent-decoded, since
 * a proxy or a later redirect may decode "%2e" and "%2f" and see a different path.
 */
export function safeRedirect(to: unknown, fallback = "/"): string {
  if (typeof to !== "string" || to.length === 0 || to.length > 2048 || !isLocalPath(to)) return fallback;
  let url: URL;
  try {
    url = new URL(to, BASE);
  } catch {
    return fallback;
  }
  if (url.origin !== BASE || !isLocalPath(url.pathname)) return fallback;
  const decoded = decodedPath(url.pathname);
  if (decoded === null || !isLocalPath(decoded) || decoded.includes("\\")) return fallback;
  // Decoding must not reveal dot segments or doubled slashes that resolving would act on.
  if (decodedPath(new URL(decoded, BASE).pathname) !== decoded) return fallback;
  // Going back to a sign-in page after signing in would only loop (routes match in any case).
  const page = decoded.toLowerCase();
  if (AUTH_PAGES.some((p) => page === p || page.startsWith(p.endsWith("/") ? p : `${p}/`))) return fallback;
  return `${url.pathname}${url.search}${url.hash}`;
}

// Percent-decoded until nothing changes (double encoding is decoded too); null when undecodable.
function decodedPath(path: string): string | null {
  let current = path;
  for (let round = 0; round < 4; round++) {
    let next: string;
    try {
      next = decodeURIComponent(current);
    } catch {
      return null;
    }
    if (next === current) return current;
    current = next;
  }
  return null;
}

/** `/sign-in?redirectTo=…` for the page a visitor was refused. */
export function signInPath(returnTo: string): string {
  const target = safeRedirect(returnTo, "");
  return target ? `/sign-in?${new URLSearchParams({ redirectTo: target })}` : "/sign-in";
}
