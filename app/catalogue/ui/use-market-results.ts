import { useRef } from "react";
import { keepPreviousData, useInfiniteQuery, type InfiniteData } from "@tanstack/react-query";
import type { ListingsPage } from "@shared/market-filters";
import { fetchListings, ListingsError } from "~/catalogue/listings-client";

// The results for the URL's filters from /api/v1/listings, a cursor page at a time. The loader's page
// is the first answer for the filters it rendered; while the next filters load, the last results stay.

export interface FirstPage {
  /** The canonical parameters the loader searched with. */
  params: string;
  page: ListingsPage;
}

export function listingsKey(params: string) {
  return ["listings", params] as const;
}

export function useMarketResults(params: string, first: FirstPage | null) {
  const query = useInfiniteQuery<
    ListingsPage,
    Error,
    InfiniteData<ListingsPage, string | null>,
    ReturnType<typeof listingsKey>,
    string | null
  >({
    queryKey: listingsKey(params),
    queryFn: ({ pageParam, signal }) => fetchListings(params, pageParam, signal),
    initialPageParam: null,
    getNextPageParam: (last) => last.nextCursor,
    initialData: first && first.params === params ? { pages: [first.page], pageParams: [null] } : undefined,
    placeholderData: keepPreviousData,
    // A refused request (bad parameter) is refused again; only a lost connection or a server fault is retried.
    retry: (count, error) => count < 1 && !(error instanceof ListingsError && error.status >= 400 && error.status < 500),
  });
  // After a refusal the last good results stay on screen while the buyer fixes the field.
  const lastGood = useRef<InfiniteData<ListingsPage, string | null> | undefined>(undefined);
  if (query.data && !query.isPlaceholderData) lastGood.current = query.data;
  const data = query.data ?? lastGood.current;
  const pages = data?.pages ?? [];
  return {
    items: pages.flatMap((p) => p.items),
    total: pages[0]?.total ?? 0,
    counts: pages[0]?.counts ?? null,
    hasData: pages.length > 0,
    /** New filters are loading; what shows is the previous answer. */
    updating: query.isPlaceholderData,
    /** Nothing to show yet (no answer for any filters so far). */
    loading: pages.length === 0 && query.isFetching,
    loadingMore: query.isFetchingNextPage,
    hasMore: query.hasNextPage,
    loadMore: () => void query.fetchNextPage(),
    error:
      query.error instanceof ListingsError ? query.error : query.error ? new ListingsError(0, "Something went wrong; try again.") : null,
    retry: () => void query.refetch(),
  };
}
