import { Form } from "react-router";
import type { ListedFigure } from "@shared/bench/remeasure";
import { Button } from "~/components/Button";
import { TextareaField } from "~/components/Field";
import { ReceivingSafely } from "~/components/cautions/ReceivingSafely";
import { CONTEST_NOTE_MAX, CONTEST_PHOTOS_MAX, CONTEST_REASONS, CONTEST_REASON_LABELS } from "../contest-words";
import type { FieldErrors } from "../readings-form";
import { ReadingsEntry } from "./ReadingsEntry";
import { ContestCaptureFields } from "./ContestCaptureFields";

// Contesting an order inside the audition window: a reason, what is wrong in the buyer's words, photos,
// and the buyer's own figures beside the bench sheet's. Multipart, so photos travel with it; it posts
// without JavaScript and the server's errors come back beside each field.

export const CONTEST_INTENT = "contest";

export interface ContestFormProps {
  figures: readonly ListedFigure[];
  errors?: FieldErrors;
  values?: Record<string, string>;
  /** Where it posts; the page's own action with `?intent=contest` unless told. */
  action?: string;
}

export function ContestForm({ figures, errors = {}, values = {}, action = `?intent=${CONTEST_INTENT}` }: ContestFormProps) {
  const reason = values.reason ?? "";
  return (
    <Form method="post" action={action} encType="multipart/form-data" className="space-y-6" aria-labelledby="contest-heading">
      <div className="space-y-1">
        <h2 id="contest-heading" className="text-lg leading-snug">
          Contest this order
        </h2>
        <p className="text-sm text-ink-soft">
          The money stays held while a moderator looks at both sides. Say what is wrong; photos and your own figures help.
        </p>
      </div>
      {errors._form ? (
        <p role="alert" className="rounded-md border border-fault/35 bg-fault-wash px-3 py-2 text-sm text-fault">
          {errors._form}
        </p>
      ) : null}
      <fieldset className="space-y-2" aria-describedby={errors.reason ? "contest-reason-error" : undefined}>
        <legend className="text-sm font-medium text-ink">What is wrong</legend>
        {CONTEST_REASONS.map((r) => (
          <label key={r} className="flex cursor-pointer items-start gap-2 text-sm">
            <input type="radio" name="reason" value={r} defaultChecked={r === reason} required className="mt-1 size-4 accent-walnut" />
            <span>{CONTEST_REASON_LABELS[r]}</span>
          </label>
        ))}
        {errors.reason ? (
          <p id="contest-reason-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
            {errors.reason}
          </p>
        ) : null}
      </fieldset>
      <TextareaField
        name="note"
        label="In your words"
        hint="What you heard or saw, when, and what you tried. The seller and the moderator read this."
        defaultValue={values.note ?? ""}
        error={errors.note}
        maxLength={CONTEST_NOTE_MAX}
        required
        rows={5}
      />
      <div className="space-y-1.5">
        <label htmlFor="contest-photos" className="flex items-baseline justify-between gap-2 text-sm font-medium text-ink">
          <span>Photos</span>
          <span className="text-xs font-normal text-ink-faint">optional</span>
        </label>
        <input
          id="contest-photos"
          type="file"
          name="photos"
          multiple
          accept="image/jpeg,image/png"
          aria-describedby={errors.photos ? "contest-photos-hint contest-photos-error" : "contest-photos-hint"}
          aria-invalid={errors.photos ? true : undefined}
          className="block w-full text-sm text-ink-soft file:mr-3 file:rounded-md file:border file:border-rule-strong file:bg-card file:px-3 file:py-1.5 file:text-sm file:text-ink"
        />
        <p id="contest-photos-hint" className="text-[0.8125rem] text-ink-faint">
          Up to {CONTEST_PHOTOS_MAX} JPEG or PNG photos: damage, the packing, your measurement set-up. Only you and Loadline's moderators
          see them, with their camera and location details removed.
        </p>
        {errors.photos ? (
          <p id="contest-photos-error" role="alert" className="text-[0.8125rem] font-medium text-fault">
            {errors.photos}
          </p>
        ) : null}
      </div>
      <ReceivingSafely headingLevel={3} />
      <ReadingsEntry figures={figures} errors={errors} values={values} />
      <ContestCaptureFields errors={errors} values={values} />
      <Button type="submit" variant="danger">
        Contest the order
      </Button>
    </Form>
  );
}
