import { data, redirect } from "react-router";
import { z } from "zod";
import { assertSameOrigin } from "~/auth/csrf.server";
import { safeRedirect } from "~/auth/redirect";
import { redirectWithNotice } from "~/auth/session.server";
import { readPageForm } from "~/http/body.server";
import { idSchema } from "@shared/ids";
import { changeList, compareListCookie, readCompareList } from "./compare-list.server";
import { publicIds } from "./compare.server";
import { compareHref } from "./selection";
import type { CompareActionResult } from "./types";

// Adding to, removing from and clearing the compare list. A plain form sends `returnTo` and is sent
// back there (a refusal rides along as a one-time notice); the page's script leaves it out and gets
// JSON, so the controls update in place.

const CompareForm = z
  .object({
    intent: z.enum(["add", "remove", "clear"], { message: "Choose add, remove or clear." }),
    listingId: idSchema("listing").optional(),
    returnTo: z.string().max(2048).optional(),
  })
  .refine((f) => f.intent === "clear" || f.listingId, { message: "Say which unit.", path: ["listingId"] });

const NOT_AVAILABLE = "That unit is no longer available to compare.";

export async function changeCompareList(request: Request) {
  assertSameOrigin(request);
  const fields = Object.fromEntries(await readPageForm(request));
  const parsed = CompareForm.safeParse({ ...fields, listingId: fields.listingId || undefined, returnTo: fields.returnTo || undefined });
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return data<CompareActionResult>({ ok: false, reason: issue.message, path: String(issue.path[0] ?? "") }, { status: 400 });
  }
  const { intent, listingId, returnTo } = parsed.data;
  const list = await readCompareList(request);
  // Draft, held and missing units are refused alike, so the answer says nothing about which it was.
  if (intent === "add" && !list.includes(listingId!.toLowerCase()) && !(await publicIds([listingId!.toLowerCase()])).length) {
    return refuse(request, returnTo, NOT_AVAILABLE, 404);
  }
  const change = changeList(list, { intent, listingId });
  if (!change.ok) return refuse(request, returnTo, change.reason, 409);
  const headers = { "Set-Cookie": await compareListCookie(change.ids) };
  if (returnTo) throw redirect(safeRedirect(returnTo, compareHref(change.ids)), { headers });
  return data<CompareActionResult>({ ok: true, ids: change.ids }, { headers });
}

async function refuse(request: Request, returnTo: string | undefined, reason: string, status: number) {
  if (returnTo) throw await redirectWithNotice(request, safeRedirect(returnTo, "/compare"), reason);
  return data<CompareActionResult>({ ok: false, reason }, { status });
}
