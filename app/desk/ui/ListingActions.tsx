import { Form } from "react-router";
import { Button } from "~/components/Button";
import { Card, CardTitle } from "~/components/Card";
import { FormError, TextareaField } from "~/components/Field";
import type { ActionErrors, ListingIntent } from "../listing-actions.server";

// The verdict on a listing: one note (required, it goes on the trail and to the seller) and a button
// per action the listing's state allows. Closed while another moderator holds the item.

const BUTTONS: { intent: Exclude<ListingIntent, "dismiss_flag">; label: string; variant: "primary" | "secondary" | "danger" }[] = [
  { intent: "clear_hold", label: "Clear the hold", variant: "primary" },
  { intent: "ask_changes", label: "Ask for changes", variant: "secondary" },
  { intent: "remove_listing", label: "Remove the listing", variant: "danger" },
];

export function ListingActions({
  actions,
  disabled,
  errors,
  values,
}: {
  actions: ListingIntent[];
  disabled: boolean;
  errors: ActionErrors;
  values: { intent?: string; note?: string; flagId?: string };
}) {
  const shown = BUTTONS.filter((b) => actions.includes(b.intent));
  if (!shown.length) return null;
  const mine = values.intent !== "dismiss_flag";
  return (
    <Card className="space-y-4" aria-labelledby="desk-verdict">
      <CardTitle>
        <span id="desk-verdict">Your decision</span>
      </CardTitle>
      <Form method="post" className="space-y-4" aria-labelledby="desk-verdict">
        {mine && errors.form ? <FormError>{errors.form}</FormError> : null}
        <fieldset disabled={disabled} className="space-y-4">
          <TextareaField
            label="Note"
            name="note"
            required
            maxLength={2000}
            rows={4}
            hint="Required. It goes on the listing's trail and in the mail to the seller; when you ask for changes the seller sees it in the editor."
            defaultValue={mine ? values.note : undefined}
            error={mine ? errors.note : undefined}
          />
          <div className="flex flex-wrap gap-2">
            {shown.map((b) => (
              <Button key={b.intent} type="submit" name="intent" value={b.intent} variant={b.variant}>
                {b.label}
              </Button>
            ))}
          </div>
        </fieldset>
      </Form>
    </Card>
  );
}

/** Dismissing one flag: its own small form under the flag. */
export function DismissFlagForm({
  flagId,
  disabled,
  errors,
  values,
}: {
  flagId: string;
  disabled: boolean;
  errors: ActionErrors;
  values: { intent?: string; note?: string; flagId?: string };
}) {
  const mine = values.intent === "dismiss_flag" && values.flagId === flagId;
  return (
    <Form method="post" className="space-y-3 border-t border-rule pt-3">
      {mine && errors.form ? <FormError>{errors.form}</FormError> : null}
      <input type="hidden" name="flagId" value={flagId} />
      <fieldset disabled={disabled} className="space-y-3">
        <TextareaField
          label="Why dismiss it"
          name="note"
          required
          maxLength={2000}
          rows={2}
          defaultValue={mine ? values.note : undefined}
          error={mine ? errors.note : undefined}
        />
        <Button type="submit" name="intent" value="dismiss_flag" variant="secondary" size="sm">
          Dismiss this flag
        </Button>
      </fieldset>
    </Form>
  );
}
