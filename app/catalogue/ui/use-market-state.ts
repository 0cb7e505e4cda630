import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { useSearchParams } from "react-router";
import { marketFiltersToParams, parseMarketFilters, type FilterIssue, type MarketFilters } from "@shared/market-filters";

// The market's state lives in the URL. The panel edits a draft of the raw parameters (text as typed,
// so "80W" stays "80W" while the buyer types); a change is pushed to the URL as canonical parameters,
// at once for a click and after a pause for typing. When the URL changes by any other way (back,
// forward, a link), the draft follows it.

/** How long typing must pause before the results follow. */
export const TYPING_PAUSE_MS = 350;

/** The canonical spelling of raw parameters (bad values dropped). */
export function canonicalOf(raw: string): string {
  return marketFiltersToParams(parseMarketFilters(new URLSearchParams(raw)).filters).toString();
}

export interface MarketState {
  /** What the URL holds: these drive the results. */
  filters: MarketFilters;
  /** The URL's canonical parameters (the results' query key). */
  canonical: string;
  /** The panel's raw values. */
  draft: URLSearchParams;
  /** Messages for the draft's bad values, by parameter. */
  issues: FilterIssue[];
  /** A click (checkbox, select, radio): the URL follows at once. */
  choose: (name: string, value: string | readonly string[] | null) => void;
  /** Typing: the URL follows after a pause. */
  type: (name: string, value: string) => void;
  /** Enter or the submit button: the URL follows at once. */
  apply: () => void;
}

export function useMarketState(): MarketState {
  const [searchParams, setSearchParams] = useSearchParams();
  const url = searchParams.toString();
  const [draft, setDraft] = useState(url);
  const latest = useRef({ url, draft });
  latest.current = { url, draft };
  const timer = useRef<ReturnType<typeof setTimeout> | undefined>(undefined);

  const commit = useCallback(
    (next: string) => {
      clearTimeout(timer.current);
      const params = new URLSearchParams(next);
      // A changed search starts at the top.
      params.delete("page");
      params.delete("cursor");
      setDraft(params.toString());
      const target = canonicalOf(params.toString());
      if (target !== canonicalOf(latest.current.url)) setSearchParams(new URLSearchParams(target), { preventScrollReset: true });
    },
    [setSearchParams],
  );

  // Back, forward or a link: the panel shows what the URL now says. (A keystroke still waiting then
  // commits this same state, so it changes nothing.)
  const [seen, setSeen] = useState(url);
  if (seen !== url) {
    setSeen(url);
    if (canonicalOf(url) !== canonicalOf(draft)) setDraft(url);
  }
  useEffect(() => () => clearTimeout(timer.current), []);

  const choose = useCallback(
    (name: string, value: string | readonly string[] | null) => commit(withParam(latest.current.draft, name, value)),
    [commit],
  );
  const type = useCallback(
    (name: string, value: string) => {
      let next = withParam(latest.current.draft, name, value);
      // Relevance needs words: clearing the search box also clears that sort.
      if (name === "q" && !value.trim() && new URLSearchParams(next).get("sort") === "relevance") next = withParam(next, "sort", null);
      setDraft(next);
      latest.current.draft = next;
      clearTimeout(timer.current);
      timer.current = setTimeout(() => commit(latest.current.draft), TYPING_PAUSE_MS);
    },
    [commit],
  );
  const apply = useCallback(() => commit(latest.current.draft), [commit]);

  const applied = useMemo(() => parseMarketFilters(searchParams).filters, [searchParams]);
  const draftParams = useMemo(() => new URLSearchParams(draft), [draft]);
  const issues = useMemo(() => parseMarketFilters(draftParams).issues, [draftParams]);
  return { filters: applied, canonical: marketFiltersToParams(applied).toString(), draft: draftParams, issues, choose, type, apply };
}

/** Raw parameters with one parameter replaced (null or empty removes it). */
export function withParam(raw: string, name: string, value: string | readonly string[] | null): string {
  const params = new URLSearchParams(raw);
  params.delete(name);
  for (const v of value === null ? [] : typeof value === "string" ? [value] : value) if (v !== "") params.append(name, v);
  return params.toString();
}

/** A repeatable parameter's values, also when given comma-separated. */
export function valuesOf(params: URLSearchParams, name: string): string[] {
  return params
    .getAll(name)
    .flatMap((v) => v.split(","))
    .map((v) => v.trim())
    .filter(Boolean);
}
