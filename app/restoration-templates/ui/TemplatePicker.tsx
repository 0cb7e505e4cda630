import { Form, Link } from "react-router";
import { Button } from "~/components/Button";
import { controlClass } from "~/components/Field";

/**
 * "Use a template" above the restoration log's new entry: a GET form, so it works without JavaScript; the
 * step's loader fills the entry form from the chosen template. With JavaScript the choice applies at once.
 */
export function TemplatePicker({ choices, chosenId }: { choices: { id: string; title: string }[]; chosenId: string | null }) {
  if (!choices.length)
    return (
      <p className="text-sm text-ink-soft">
        Jobs you do often can start from a <Link to="/sell/templates">restoration template</Link>.
      </p>
    );
  return (
    <Form method="get" className="flex flex-wrap items-end gap-2" aria-label="Use a template">
      <label className="min-w-0 flex-1 space-y-1">
        <span className="text-sm font-medium text-ink">Use a template</span>
        <select
          name="template"
          defaultValue={chosenId ?? ""}
          className={controlClass}
          onChange={(e) => e.currentTarget.form?.requestSubmit()}
        >
          <option value="">Start from a blank entry</option>
          {choices.map((c) => (
            <option key={c.id} value={c.id}>
              {c.title}
            </option>
          ))}
        </select>
      </label>
      <Button type="submit" variant="secondary">
        Fill the entry
      </Button>
      <Link to="/sell/templates" className="inline-flex h-10 items-center px-1 text-sm">
        Manage templates
      </Link>
    </Form>
  );
}
