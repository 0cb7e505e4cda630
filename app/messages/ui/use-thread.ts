import { useEffect } from "react";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchConversation, postMessage, threadKey } from "../thread-client";
import type { Conversation } from "../types";

// The conversation in the browser: the page's loader data first, then the threads API every 15 s
// and on focus (the other side's answers appear without a reload); a message sent from here goes
// through the API and the conversation is fetched again. When the page's own loader runs again
// (after an offer form), its newer data replaces the cached copy.

export const THREAD_REFRESH_MS = 15_000;

export function useThread(initial: Conversation) {
  const queryClient = useQueryClient();
  const key = threadKey(initial.thread.id);
  const query = useQuery({
    queryKey: key,
    queryFn: () => fetchConversation(initial.thread.id),
    initialData: initial,
    staleTime: 5_000,
    refetchInterval: THREAD_REFRESH_MS,
    refetchOnWindowFocus: true,
  });
  useEffect(() => {
    queryClient.setQueryData(key, initial);
    // `key` is derived from `initial`; the loader's new object is the only trigger wanted.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [initial, queryClient]);
  const send = useMutation({
    mutationFn: (body: string) => postMessage(initial.thread.id, body),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: key });
    },
  });
  return { conversation: query.data, send, refreshing: query.isFetching };
}
