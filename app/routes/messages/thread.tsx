import { data, isRouteErrorResponse, Link, redirect } from "react-router";
import type { Route } from "./+types/thread";
import { assertSameOrigin } from "~/auth/csrf.server";
import { requireUser } from "~/auth/guards.server";
import { readPageForm } from "~/http/body.server";
import { pageError } from "~/http/errors.server";
import { conversation } from "~/messages/threads.server";
import { threadAction } from "~/messages/thread-action.server";
import { PageHeader } from "~/components/PageHeader";
import { ErrorPage } from "~/components/ErrorPage";
import { ThreadView } from "~/messages/ui/ThreadView";

// One conversation between a listing's buyer and its seller: messages and offers together. Only the
// two of them may open it (anyone else gets the same 404 as a missing thread).

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  try {
    return data({ conversation: await conversation(user.id, params.threadId) }, { headers: { "Cache-Control": "private, no-store" } });
  } catch (error) {
    pageError(error);
  }
}

export async function action({ request, params }: Route.ActionArgs) {
  assertSameOrigin(request);
  const user = await requireUser(request);
  const form = Object.fromEntries(await readPageForm(request));
  const outcome = await threadAction(user, params.threadId, form);
  if (outcome.ok) return redirect(`/messages/${params.threadId}`);
  return data({ errors: outcome.errors, draft: outcome.draft }, { status: outcome.status });
}

export const meta: Route.MetaFunction = ({ data: d }) => [
  { title: `${d?.conversation.thread.listingTitle ?? "Conversation"} · Messages · Loadline` },
  { name: "robots", content: "noindex" },
];

export default function Thread({ loaderData, actionData }: Route.ComponentProps) {
  const { thread } = loaderData.conversation;
  return (
    <main className="mx-auto w-full max-w-3xl space-y-6 px-4 py-8 sm:px-6 sm:py-10">
      <p className="text-sm">
        <Link to="/messages">← All messages</Link>
      </p>
      <PageHeader
        overline={thread.role === "buyer" ? `Seller: ${thread.otherName}` : `Buyer: ${thread.otherName}`}
        title={thread.listingTitle}
        lede={thread.listingStatus === "live" ? null : "This unit is no longer for sale."}
        actions={
          <Link to={`/messages/${thread.id}/report`} className="text-sm text-ink-soft hover:text-walnut">
            Report this conversation
          </Link>
        }
      />
      <ThreadView initial={loaderData.conversation} errors={actionData?.errors} draft={actionData?.draft} />
    </main>
  );
}

export function ErrorBoundary({ error }: Route.ErrorBoundaryProps) {
  if (isRouteErrorResponse(error)) {
    const body: unknown = error.data;
    const message = typeof body === "object" && body && "message" in body ? String(body.message) : undefined;
    return <ErrorPage status={error.status} message={message} />;
  }
  return <ErrorPage status={500} />;
}
