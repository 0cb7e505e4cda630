import { Form } from "react-router";
import type { ListedFigure } from "@shared/bench/remeasure";
import { Button } from "~/components/Button";
import { ReceivingSafely } from "~/components/cautions/ReceivingSafely";
import type { FieldErrors } from "../readings-form";
import { ReadingsEntry } from "./ReadingsEntry";

// Accepting the unit inside the audition window, optionally with the buyer's own figures (kept with the
// order beside the bench sheet's). Blank boxes are fine: accepting needs no figures.

export const ACCEPT_INTENT = "accept";

export interface AcceptWithReadingsFormProps {
  figures: readonly ListedFigure[];
  errors?: FieldErrors;
  values?: Record<string, string>;
  action?: string;
}

export function AcceptWithReadingsForm({
  figures,
  errors = {},
  values = {},
  action = `?intent=${ACCEPT_INTENT}`,
}: AcceptWithReadingsFormProps) {
  return (
    <Form method="post" action={action} className="space-y-6" aria-labelledby="accept-heading">
      <div className="space-y-1">
        <h2 id="accept-heading" className="text-lg leading-snug">
          Accept the unit
        </h2>
        <p className="text-sm text-ink-soft">
          Accepting ends the audition window and releases the money to the seller. If you measured it, add your figures: they are kept with
          the order beside the bench sheet&apos;s.
        </p>
      </div>
      {errors._form ? (
        <p role="alert" className="rounded-md border border-fault/35 bg-fault-wash px-3 py-2 text-sm text-fault">
          {errors._form}
        </p>
      ) : null}
      <ReceivingSafely headingLevel={3} />
      <ReadingsEntry figures={figures} errors={errors} values={values} extras={false} legend="Your own figures (optional)" />
      <Button type="submit">Accept the unit</Button>
    </Form>
  );
}
