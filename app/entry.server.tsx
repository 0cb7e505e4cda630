import { PassThrough } from "node:stream";
import type { AppLoadContext, EntryContext } from "react-router";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isRouteErrorResponse, ServerRouter } from "react-router";
import { isbot } from "isbot";
import type { RenderToPipeableStreamOptions } from "react-dom/server";
import { renderToPipeableStream } from "react-dom/server";
import { env } from "~/env.server";
import { loggable } from "~/http/log.server";
import { commonSecurityHeaders, contentSecurityPolicy, newNonce } from "~/http/security-headers.server";

// Renders every HTML document. Each response gets its own nonce: React Router's inline scripts
// (hydration data, route modules, scroll restoration) and React's streaming scripts carry it, and
// the Content-Security-Policy allows inline scripts with that nonce only.

export const streamTimeout = 5_000;

function documentHeaders(headers: Headers, nonce: string) {
  const settings = env();
  const https = settings.appUrl.startsWith("https://");
  const policy = contentSecurityPolicy({
    nonce,
    https,
    // Signing in with a Loadline pass posts to /auth/oauth, which redirects the form to the provider;
    // the checkout form redirects to the payment provider's hosted page.
    formTargets: [new URL(settings.oauth.issuer).origin, paymentPagesOrigin(settings)],
    dev: import.meta.env.DEV,
  });
  headers.set("Content-Security-Policy", policy);
  for (const [name, value] of commonSecurityHeaders({ https })) headers.set(name, value);
}

/** Where the payment provider's hosted pages live: the stand-in serves them from its API address. */
function paymentPagesOrigin(settings: ReturnType<typeof env>): string {
  return settings.stripe.mode === "fake" ? new URL(settings.stripe.apiUrl).origin : "https://checkout.stripe.com";
}

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  _loadContext: AppLoadContext,
) {
  const nonce = newNonce();
  documentHeaders(responseHeaders, nonce);
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }

  return new Promise((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    // Crawlers get the whole document at once; browsers get the shell as soon as it is ready.
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";

    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    const { pipe, abort } = renderToPipeableStream(<ServerRouter context={routerContext} url={request.url} nonce={nonce} />, {
      nonce,
      [readyOption]() {
        shellRendered = true;
        const body = new PassThrough({
          final(callback) {
            clearTimeout(timeoutId);
            timeoutId = undefined;
            callback();
          },
        });
        const stream = createReadableStreamFromReadable(body);
        responseHeaders.set("Content-Type", "text/html");
        pipe(body);
        resolve(new Response(stream, { headers: responseHeaders, status: responseStatusCode }));
      },
      onShellError(error: unknown) {
        reject(error);
      },
      onError(error: unknown) {
        responseStatusCode = 500;
        // Errors inside the shell are logged by React Router; only later streaming errors here.
        if (shellRendered) console.error(error);
      },
    });
  });
}

/**
 * Server errors are logged without what they carry: a database error holds its SQL parameters (a
 * whole bench sheet, an e-mail address), which have no place in a log. Aborted requests are not errors.
 */
export function handleError(error: unknown, { request }: { request: Request }) {
  if (request.signal.aborted) return;
  // A refused method or a missing page is the client's mistake, answered with its status: not a server error.
  if (isRouteErrorResponse(error) && error.status < 500) return;
  console.error(`[web] ${request.method} ${new URL(request.url).pathname}:`, loggable(error));
}
