// Where to send a browser after signing in. Only paths on this site are accepted, so a crafted
// `redirectTo` cannot bounce a freshly signed-in user to another site.
const AUTH_PAGES = ["/sign-in", "/sign-up", "/sign-out", "/forgot-password", "/reset-password", "/verify-email", "/auth/"];

export function safeRedirect(to: unknown, fallback = "/"): string {
  if (typeof to !== "string" || to.length === 0 || to.length > 2048) return fallback;
  // Browsers treat "//host" and "/\host" as other sites; control characters can smuggle either.
  if (!to.startsWith("/") || to.startsWith("//") || to.startsWith("/\\")) return fallback;
  if (/[\u0000-\u001f\u007f]/.test(to)) return fallback;
  let url: URL;
  try {
    url = new URL(to, "http://loadline.invalid");
  } catch {
    return fallback;
  }
  if (url.origin !== "http://loadline.invalid") return fallback;
  // Going back to a sign-in page after signing in would only loop.
  if (AUTH_PAGES.some((p) => url.pathname === p || url.pathname.startsWith(p.endsWith("/") ? p : `${p}/`))) {
    return fallback;
  }
  return `${url.pathname}${url.search}${url.hash}`;
}

/** `/sign-in?redirectTo=…` for the page a visitor was refused. */
export function signInPath(returnTo: string): string {
  const target = safeRedirect(returnTo, "");
  return target ? `/sign-in?${new URLSearchParams({ redirectTo: target })}` : "/sign-in";
}
