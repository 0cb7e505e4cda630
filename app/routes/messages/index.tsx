import { data, Link, redirect } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/index";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { openThread, threadList } from "~/messages/threads.server";
import { idSchema } from "@shared/ids";
import { PageHeader } from "~/components/PageHeader";
import { Badge } from "~/components/Badge";
import { cx } from "~/components/cx";
import { momentText } from "@shared/dates";

// The user's conversations, those with something unread first. Its action is the listing page's
// "Ask the seller" and "Make an offer": open (or find) the buyer's thread and go there.

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return data({ threads: await threadList(user.id) }, { headers: { "Cache-Control": "private, no-store" } });
}

const OpenForm = z.object({ intent: z.enum(["ask", "offer"]).default("ask"), listingId: idSchema("listing") });

export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const parsed = OpenForm.safeParse(Object.fromEntries(await readPageForm(request)));
  if (!parsed.success) throw data({ message: "That form was incomplete; open the listing and try again." }, { status: 400 });
  try {
    const thread = await openThread(user.id, parsed.data.listingId);
    return redirect(`/messages/${thread.id}${parsed.data.intent === "offer" ? "#make-offer" : ""}`);
  } catch (error) {
    pageError(error);
  }
}

export const meta: Route.MetaFunction = () => [{ title: "Messages · Loadline" }, { name: "robots", content: "noindex" }];

export default function Messages({ loaderData }: Route.ComponentProps) {
  const { threads } = loaderData;
  const unread = threads.filter((t) => t.unread).length;
  return (
    <main className="mx-auto w-full max-w-3xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Talking before buying"
        title="Messages"
        lede={
          threads.length ? (
            <>
              <span className="figures">{unread}</span> of <span className="figures">{threads.length}</span>{" "}
              {threads.length === 1 ? "conversation has" : "conversations have"} something new.
            </>
          ) : null
        }
      />
      {threads.length === 0 ? (
        <p className="text-ink-soft">
          No conversations yet. On a unit&apos;s page, <strong>Ask the seller</strong> starts one.
        </p>
      ) : (
        <ul className="divide-y divide-rule overflow-hidden rounded-panel border border-rule bg-card" data-testid="threads">
          {threads.map((t) => (
            <li key={t.id}>
              <Link
                to={`/messages/${t.id}`}
                className={cx("block px-4 py-3 no-underline hover:bg-sunk", t.unread && "bg-walnut-wash/40")}
                aria-label={`${t.listingTitle}, with ${t.otherName}${t.unread ? ", unread" : ""}`}
              >
                <span className="flex flex-wrap items-baseline justify-between gap-2">
                  <span className={cx("text-ink", t.unread ? "font-semibold" : "font-medium")}>{t.listingTitle}</span>
                  {t.lastMessageAt ? <span className="figures text-xs text-ink-faint">{momentText(t.lastMessageAt)}</span> : null}
                </span>
                <span className="mt-0.5 flex flex-wrap items-center gap-2 text-sm text-ink-soft">
                  {t.role === "buyer" ? `Seller: ${t.otherName}` : `Buyer: ${t.otherName}`}
                  {t.unread ? <Badge tone="walnut">New</Badge> : null}
                </span>
                {t.lastBody ? <span className="mt-1 block truncate text-sm text-ink-faint">{t.lastBody}</span> : null}
              </Link>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
