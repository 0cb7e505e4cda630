import { data, Form, isRouteErrorResponse, Link } from "react-router";
import { z } from "zod";
import type { Route } from "./+types/watching";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { setWatch, watchList } from "~/listings/watch.server";
import { Button, ButtonLink } from "~/components/Button";
import { ErrorPage } from "~/components/ErrorPage";
import { ListingCard } from "~/components/ListingCard";
import { PageHeader } from "~/components/PageHeader";
import { WatchButton } from "~/components/WatchButton";
import { idSchema } from "@shared/ids";
import { setWatchMail, watchMailOn } from "~/alerts/unsubscribe.server";

// The buyer's watch list: the watched units as market cards, newest watch first. An unwatched card
// stays until the page is next loaded, so a slip of the finger can be undone with the same button.

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  return data(
    { watches: await watchList(user.id), watchMail: await watchMailOn(user.id) },
    { headers: { "Cache-Control": "private, no-store" } },
  );
}

const WatchForm = z.object({
  intent: z.enum(["watch", "unwatch"], { message: "Choose watch or unwatch." }),
  listingId: idSchema("listing"),
});

// The cards' buttons without JavaScript.
export async function action({ request }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = Object.fromEntries(await readPageForm(request));
  // The watch notices' switch (an unsubscribe link turns them off; this turns them back on).
  if (form.intent === "watch-mail") {
    await setWatchMail(user.id, form.on === "1");
    return { watchMail: form.on === "1" };
  }
  const parsed = WatchForm.safeParse(form);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return data({ reason: issue.message, path: String(issue.path[0] ?? "") }, { status: 400 });
  }
  const result = await setWatch(user, parsed.data.listingId, parsed.data.intent === "watch");
  if (!result.ok) return data({ reason: result.reason }, { status: result.status });
  return { watching: result.watching };
}

export const meta: Route.MetaFunction = () => [{ title: "Watching · Loadline" }, { name: "robots", content: "noindex" }];

export default function Watching({ loaderData, actionData }: Route.ComponentProps) {
  const { watches } = loaderData;
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <PageHeader
        overline="Your watch list"
        title="Watching"
        lede={
          watches.length ? (
            <>
              <span className="figures">{watches.length}</span> {watches.length === 1 ? "unit" : "units"} you keep an eye on, the latest
              first.
            </>
          ) : null
        }
      />
      {actionData && "reason" in actionData ? (
        <p role="alert" className="rounded-md border border-fault/40 bg-fault-wash px-3 py-2 text-sm text-fault">
          {actionData.reason}
        </p>
      ) : null}
      {watches.length ? (
        <section aria-labelledby="watched">
          <h2 id="watched" className="sr-only">
            Watched units
          </h2>
          <ul className="grid grid-cols-1 gap-5 sm:grid-cols-2 lg:grid-cols-3">
            {watches.map((w) => (
              <li key={w.listingId} className="flex min-w-0">
                <ListingCard
                  listing={w.listing}
                  href={`/listings/${w.listingId}`}
                  className="w-full"
                  action={<WatchButton listingId={w.listingId} watching action="/watching" layout="card" />}
                />
              </li>
            ))}
          </ul>
        </section>
      ) : (
        <div className="rounded-panel border border-dashed border-rule-strong bg-card/60 px-6 py-12 text-center">
          <h2 className="text-xl">Nothing on your watch list yet</h2>
          <p className="mx-auto mt-2 max-w-md text-ink-soft">
            Press <span className="font-medium text-ink">Watch</span> on a unit in the market or on its page, and it waits for you here.
          </p>
          <ButtonLink to="/market" className="mt-5">
            Browse the market
          </ButtonLink>
        </div>
      )}
      <WatchMailSwitch on={loaderData.watchMail} />
      <p className="text-sm text-ink-faint">
        Units a seller withdraws or the review desk holds leave this list.{" "}
        <Link to="/market" className="underline decoration-rule-strong underline-offset-2 hover:text-ink">
          Back to the market
        </Link>{" "}
        ·{" "}
        <Link to="/alerts" className="underline decoration-rule-strong underline-offset-2 hover:text-ink">
          Your spec alerts
        </Link>
      </p>
    </main>
  );
}

function WatchMailSwitch({ on }: { on: boolean }) {
  return (
    <Form method="post" className="flex flex-wrap items-center gap-3 rounded-md border border-rule bg-card px-4 py-3 text-sm">
      <input type="hidden" name="intent" value="watch-mail" />
      <input type="hidden" name="on" value={on ? "0" : "1"} />
      <p className="text-ink-soft">
        {on ? "We e-mail you when a watched unit's price drops, or it is sold or withdrawn." : "E-mails about watched units are off."}
      </p>
      <Button type="submit" variant="secondary" size="sm">
        {on ? "Stop these e-mails" : "E-mail me again"}
      </Button>
    </Form>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) return <ErrorPage status={error.status} />;
  return <ErrorPage status={500} />;
}
