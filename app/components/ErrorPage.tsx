import { Link } from "react-router";
import { buttonClass } from "./Button";

const COPY: Record<number, { overline: string; title: string; text: string }> = {
  404: {
    overline: "404 · Not found",
    title: "Nothing on the bench here",
    text: "The page or unit you asked for is not here. It may have been sold or withdrawn, or the address has a typo.",
  },
  403: {
    overline: "403 · Not for this account",
    title: "This page needs another role",
    text: "You are signed in, but your account does not have the role this page needs.",
  },
  401: {
    overline: "401 · Sign in",
    title: "Sign in to continue",
    text: "This page is only for signed-in accounts.",
  },
  400: {
    overline: "400 · Could not be read",
    title: "That request could not be read",
    text: "What was sent does not fit the form. Go back, reload the page and try again.",
  },
  413: {
    overline: "413 · Too large",
    title: "That was more than this form takes",
    text: "Send less at once: shorten the text, or split it over several saves.",
  },
  415: {
    overline: "415 · Not a form",
    title: "That request could not be read",
    text: "This address takes an HTML form. Send it from the page, or as application/x-www-form-urlencoded or multipart/form-data.",
  },
  500: {
    overline: "500 · Our fault",
    title: "Something went wrong on our side",
    text: "The page could not be put together. Nothing you did caused it; try again in a moment.",
  },
};

/** The full-page error: a clear title, what it means, and where to go next. */
export function ErrorPage({ status, message, detail }: { status: number; message?: string; detail?: string }) {
  const copy =
    COPY[status] ??
    (status >= 500 ? COPY[500] : { overline: `${status}`, title: "That did not work", text: "The request could not be completed." });
  return (
    <main className="mx-auto flex w-full max-w-2xl flex-1 flex-col justify-center px-4 py-16 sm:px-6">
      <p className="figures text-sm font-medium uppercase tracking-[0.14em] text-brass-ink">{copy.overline}</p>
      <h1 className="mt-2 text-3xl leading-tight sm:text-4xl">{copy.title}</h1>
      <p className="mt-4 text-lg text-ink-soft">{message ?? copy.text}</p>
      {status === 403 ? (
        <p className="mt-2 text-ink-soft">
          If you think your account should have it, ask an admin, or sign out and sign in with the account that has it.
        </p>
      ) : null}
      <div className="mt-8 flex flex-wrap gap-3">
        <Link to="/market" className={buttonClass("primary")}>
          Go to the market
        </Link>
        {status === 403 ? (
          <Link to="/account" className={buttonClass("secondary")}>
            Your account
          </Link>
        ) : status === 401 ? (
          <Link to="/sign-in" className={buttonClass("secondary")}>
            Sign in
          </Link>
        ) : (
          <Link to="/" className={buttonClass("secondary")}>
            Home
          </Link>
        )}
      </div>
      {detail ? (
        <pre className="mt-10 max-h-80 overflow-auto rounded-panel border border-rule bg-sunk p-4 text-xs text-ink-soft">{detail}</pre>
      ) : null}
    </main>
  );
}
