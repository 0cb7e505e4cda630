import { UniqueConstraintError } from "sequelize";
import { sequelize } from "~/db.server";
import { findOwn } from "~/auth/ownership.server";
import { hasRole, type SessionUser } from "~/auth/guards.server";
import { refusal, type Issue } from "~/http/errors.server";
import { RestorationTemplate } from "~/models/restoration-template.server";
import {
  entryValuesFromTemplate,
  MAX_TEMPLATES,
  RestorationTemplateSchema,
  type RestorationTemplateView,
} from "@shared/restoration-template";

// A workshop's restoration templates: its own, by title. Someone else's template answers the same 404
// as a missing one (findOwn). Callers have checked the workshop role.

const view = (t: RestorationTemplate): RestorationTemplateView => ({ id: t.id, title: t.title, work: t.work, parts: t.parts });

function parse(input: unknown) {
  const parsed = RestorationTemplateSchema.safeParse(input);
  if (!parsed.success) {
    const issues: Issue[] = parsed.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
    throw refusal("invalid", issues[0]?.message ?? "Some fields need attention.", { issues });
  }
  return parsed.data;
}

const sameTitle = () =>
  refusal("conflict", "You already have a template with that title; give this one another.", {
    issues: [{ path: "title", message: "You already have a template with that title." }],
  });

export async function listTemplates(ownerId: string): Promise<RestorationTemplateView[]> {
  const rows = await RestorationTemplate.findAll({ where: { ownerId }, order: [["title", "ASC"]] });
  return rows.map(view);
}

export async function getTemplate(ownerId: string, id: unknown): Promise<RestorationTemplateView> {
  const t = await findOwn(RestorationTemplate, id, { ownerId });
  if (!t) throw refusal("not_found", "No template of yours has that address.");
  return view(t);
}

export async function createTemplate(ownerId: string, input: unknown): Promise<RestorationTemplateView> {
  const values = parse(input);
  try {
    return await sequelize.transaction(async (transaction) => {
      // Counted under a lock on the owner's templates so two saves at once cannot pass the limit together.
      await sequelize.query("SELECT pg_advisory_xact_lock(hashtext('restoration_templates:' || $1))", { bind: [ownerId], transaction });
      const count = await RestorationTemplate.count({ where: { ownerId }, transaction });
      if (count >= MAX_TEMPLATES) throw refusal("conflict", `A workshop keeps at most ${MAX_TEMPLATES} templates; delete one first.`);
      return view(await RestorationTemplate.create({ ownerId, ...values }, { transaction }));
    });
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw sameTitle();
    throw e;
  }
}

export async function updateTemplate(ownerId: string, id: unknown, input: unknown): Promise<RestorationTemplateView> {
  const values = parse(input);
  const t = await findOwn(RestorationTemplate, id, { ownerId });
  if (!t) throw refusal("not_found", "No template of yours has that address.");
  try {
    return view(await t.update(values));
  } catch (e) {
    if (e instanceof UniqueConstraintError) throw sameTitle();
    throw e;
  }
}

export async function deleteTemplate(ownerId: string, id: unknown): Promise<void> {
  const t = await findOwn(RestorationTemplate, id, { ownerId });
  if (!t) throw refusal("not_found", "No template of yours has that address.");
  await t.destroy();
}

/**
 * What the restoration step offers a workshop: its templates' titles, and the entry form's fields filled
 * from the one chosen (`?template=<id>`); nothing for other sellers or an unknown template.
 */
export async function templatesForEditor(
  user: SessionUser,
  chosen: string | null,
): Promise<{ offered: boolean; choices: { id: string; title: string }[]; chosenId: string | null; values: Record<string, string> | null }> {
  if (!hasRole(user, "workshop")) return { offered: false, choices: [], chosenId: null, values: null };
  const templates = await listTemplates(user.id);
  const hit = chosen ? templates.find((t) => t.id === chosen) : undefined;
  return {
    offered: true,
    choices: templates.map((t) => ({ id: t.id, title: t.title })),
    chosenId: hit?.id ?? null,
    values: hit ? entryValuesFromTemplate(hit) : null,
  };
}
