import { useState, type FormEvent } from "react";
import { Link } from "react-router";
import { maskContactDetails, MASK_NOTE } from "@shared/contact-mask";
import { Button } from "~/components/Button";
import { TextareaField } from "~/components/Field";
import { cx } from "~/components/cx";
import { ThreadApiError } from "../thread-client";
import type { Conversation, MessageItem } from "../types";
import { useThread } from "./use-thread";
import { MakeOfferForm, OfferCard, type OfferFormErrors } from "./OfferCard";
import { momentText } from "@shared/dates";

// One conversation: messages and offers in the order they happened, and the compose box. The box is
// a plain form posting to the page (no JavaScript needed); with JavaScript it sends through the
// threads API and the list refreshes in place.

export interface ThreadFormErrors extends OfferFormErrors {
  body?: string;
}

export function ThreadView({ initial, errors, draft }: { initial: Conversation; errors?: ThreadFormErrors; draft?: string }) {
  const { conversation, send } = useThread(initial);
  const { thread, items } = conversation;
  const [body, setBody] = useState(draft ?? "");
  const [clientError, setClientError] = useState<string | null>(null);
  // Said before sending: what the other side will see instead of a phone number or an address.
  const willMask = thread.masking && body ? maskContactDetails(body).masked : false;

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    if (!body.trim()) {
      setClientError("Write a message first.");
      return;
    }
    setClientError(null);
    try {
      await send.mutateAsync(body);
      setBody("");
    } catch (error) {
      setClientError(error instanceof ThreadApiError ? error.message : "The message did not go; try again.");
    }
  }

  return (
    <div className="space-y-6">
      <ol className="space-y-3" aria-label="Conversation" data-testid="conversation">
        {items.length === 0 ? <li className="text-sm text-ink-faint">Nothing here yet: write the first message.</li> : null}
        {items.map((item) =>
          item.kind === "message" ? (
            <MessageBubble key={item.id} item={item} />
          ) : (
            <li key={item.id} className={cx("flex", item.fromMe ? "justify-end" : "justify-start")}>
              <OfferCard offer={item} thread={thread} errors={errors} />
            </li>
          ),
        )}
      </ol>

      <form method="post" onSubmit={(e) => void onSubmit(e)} className="space-y-3" noValidate>
        <input type="hidden" name="intent" value="send" />
        <TextareaField
          label={`Write to ${thread.otherName || "the other side"}`}
          name="body"
          rows={4}
          maxLength={4000}
          value={body}
          onChange={(e) => setBody(e.target.value)}
          error={clientError ?? errors?.body}
          hint={
            thread.masking
              ? "Phone numbers, e-mail and web addresses are hidden until the unit is paid for through Loadline's checkout."
              : undefined
          }
        />
        {willMask ? (
          <p role="status" className="rounded-md border border-brass/50 bg-brass-wash px-3 py-2 text-sm text-ink">
            {MASK_NOTE}
          </p>
        ) : null}
        <Button type="submit" disabled={send.isPending}>
          {send.isPending ? "Sending…" : "Send"}
        </Button>
      </form>

      {thread.canOffer ? <MakeOfferForm thread={thread} errors={errors} /> : null}

      <p className="text-sm text-ink-soft">
        About <Link to={thread.listingHref}>{thread.listingTitle}</Link>.
      </p>
    </div>
  );
}

function MessageBubble({ item }: { item: MessageItem }) {
  return (
    <li className={cx("flex", item.fromMe ? "justify-end" : "justify-start")}>
      <div
        className={cx(
          "max-w-[85%] rounded-panel border px-3.5 py-2.5 text-[0.9375rem]",
          item.fromMe ? "border-walnut/25 bg-walnut-wash/60" : "border-rule bg-card",
        )}
      >
        <p className="mb-1 text-xs text-ink-faint">
          <span className="font-medium text-ink-soft">{item.senderName}</span> · <span className="figures">{momentText(item.at)}</span>
        </p>
        <p className="whitespace-pre-line break-words text-ink">{item.body}</p>
        {item.masked ? (
          <p className="mt-1.5 text-xs text-brass-ink" data-testid="masked-note">
            {MASK_NOTE}
          </p>
        ) : null}
      </div>
    </li>
  );
}
