import { keepPreviousData, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import {
  applyPercent,
  type InventoryAction,
  type InventoryActionResult,
  type InventoryPage,
  type InventoryRowView,
} from "@shared/inventory";
import { fetchInventory, InventoryError, postInventoryAction } from "./inventory-client";

// The table's data through react-query: the loader's page is the first answer for the parameters it
// rendered; later filters, sorts and pages come from GET /api/v1/inventory. Actions change the rows in
// the cache at once (optimistically) and put them back as they were if the server refuses.

export const inventoryKey = (params: string) => ["inventory", params] as const;

export function useInventoryPage(params: string, first: { params: string; page: InventoryPage }) {
  return useQuery({
    queryKey: inventoryKey(params),
    queryFn: ({ signal }) => fetchInventory(params, signal),
    initialData: first.params === params ? first.page : undefined,
    placeholderData: keepPreviousData,
    retry: (count, error) => count < 1 && !(error instanceof InventoryError && error.status >= 400 && error.status < 500),
  });
}

/** What the row looks like once the action is done, as far as the browser can tell before the server answers. */
export function optimisticRow(row: InventoryRowView, action: InventoryAction): InventoryRowView {
  if (!action.ids.includes(row.id)) return row;
  switch (action.action) {
    case "withdraw":
      return { ...row, status: "withdrawn" };
    case "reprice":
      return row.priceMinor === null
        ? row
        : { ...row, priceMinor: applyPercent(row.priceMinor, action.percent, row.currency) ?? row.priceMinor };
    case "handling":
      return { ...row, handlingDays: action.handlingDays };
    case "price":
      return { ...row, priceMinor: action.priceMinor };
    case "publish":
      // Live, held or refused: only the server knows.
      return row;
  }
}

type Context = { previous: InventoryPage | undefined };

export function useInventoryAction(params: string, onDone?: (result: InventoryActionResult, action: InventoryAction) => void) {
  const client = useQueryClient();
  const key = inventoryKey(params);
  return useMutation<InventoryActionResult, InventoryError, InventoryAction, Context>({
    mutationFn: (action) => postInventoryAction(action),
    onMutate: async (action) => {
      await client.cancelQueries({ queryKey: key });
      const previous = client.getQueryData<InventoryPage>(key);
      if (previous) client.setQueryData<InventoryPage>(key, { ...previous, rows: previous.rows.map((r) => optimisticRow(r, action)) });
      return { previous };
    },
    onError: (_error, _action, context) => {
      if (context?.previous) client.setQueryData(key, context.previous);
    },
    onSuccess: (result, action) => {
      // The server's word for each unit (a publish's outcome, a rounded price) replaces the guess.
      client.setQueryData<InventoryPage>(key, (page) =>
        page
          ? {
              ...page,
              rows: page.rows.map((r) => {
                const o = result.outcomes.find((x) => x.id === r.id);
                if (!o || !o.ok) return r;
                return {
                  ...r,
                  status: o.status,
                  ...(o.priceMinor !== undefined ? { priceMinor: o.priceMinor } : {}),
                  ...(o.handlingDays !== undefined ? { handlingDays: o.handlingDays } : {}),
                  ...(o.benchVerified !== undefined ? { benchVerified: o.benchVerified } : {}),
                };
              }),
            }
          : page,
      );
      onDone?.(result, action);
    },
    // Counts per state, other pages and sorts by price may all have moved. Not awaited: the caller's
    // own onError (the message beside the price) would otherwise wait for the refetch.
    onSettled: () => {
      void client.invalidateQueries({ queryKey: ["inventory"] });
    },
  });
}
