// What a server error may put in the log: its name, message and stack, never what it carries.
import { isRouteErrorResponse } from "react-router";

/**
 * A database error holds its SQL parameters (a whole bench sheet, an e-mail address), which have no
 * place in a log: only the driver's message and code are kept.
 */
export function loggable(error: unknown): string {
  if (isRouteErrorResponse(error)) return `${error.status} ${error.statusText}`;
  if (!(error instanceof Error)) return String(error);
  const original = "original" in error && error.original instanceof Error ? error.original : null;
  const code = original && "code" in original ? ` (${String(original.code)})` : "";
  const stack = "sql" in error ? "" : `\n${error.stack ?? ""}`;
  return `${error.name}: ${original?.message ?? error.message}${code}${stack}`;
}
