import { z } from "zod";
import { sequelize } from "~/db.server";
import { findOwn } from "~/auth/ownership.server";
import { SpecAlert } from "~/models/spec-alert.server";
import { ALERT_FREQUENCIES, type AlertFrequency } from "./frequency";
import { nameText } from "@shared/text";
import { canonicalAlertQuery } from "./filters";

// A buyer's spec alerts: a name, the market's filters as its canonical query string, and how often
// to mail (at once, a daily digest, or not at all: an unsubscribe link sets "off").

export const MAX_ALERTS_PER_BUYER = 50;
export const ALERT_NAME_MAX = 80;

export const AlertName = nameText("The name")
  .min(1, "Give the alert a name, e.g. “80 W amplifiers under £1,500”.")
  .max(ALERT_NAME_MAX, `Keep the name under ${ALERT_NAME_MAX} characters.`);
export const AlertFrequencyInput = z.enum(ALERT_FREQUENCIES, { message: "Choose at once or a daily digest." });

export const NewAlertForm = z.object({
  name: AlertName,
  frequency: z.enum(["instant", "daily"], { message: "Choose at once or a daily digest." }),
  query: z.string().max(2000, "These filters are too long to save."),
});

export type AlertOutcome<T> = { ok: true; value: T } | { ok: false; field: string; message: string; status: 400 | 404 | 409 };

export function listAlerts(userId: string): Promise<SpecAlert[]> {
  return SpecAlert.findAll({
    where: { userId },
    order: [
      ["createdAt", "ASC"],
      ["id", "ASC"],
    ],
  });
}

export async function createAlert(userId: string, input: { name: string; frequency: AlertFrequency; query: string }) {
  const { query } = canonicalAlertQuery(new URLSearchParams(input.query));
  return sequelize.transaction(async (transaction): Promise<AlertOutcome<SpecAlert>> => {
    // The account row's lock keeps two racing saves from passing the limit together.
    await sequelize.query(`SELECT 1 FROM users WHERE id = :userId FOR UPDATE`, { replacements: { userId }, transaction });
    const count = await SpecAlert.count({ where: { userId }, transaction });
    if (count >= MAX_ALERTS_PER_BUYER)
      return {
        ok: false,
        field: "name",
        status: 409,
        message: `You have ${count} alerts, the most one account may keep; delete one first.`,
      };
    const alert = await SpecAlert.create({ userId, name: input.name, frequency: input.frequency, query }, { transaction });
    return { ok: true, value: alert };
  });
}

/** Rename, change how often, or delete one of the buyer's own alerts; someone else's is a 404. */
export async function changeAlert(
  userId: string,
  alertId: unknown,
  change: { name: string } | { frequency: AlertFrequency } | { delete: true },
): Promise<AlertOutcome<SpecAlert | null>> {
  const alert = await findOwn(SpecAlert, alertId, { userId });
  if (!alert) return { ok: false, field: "alertId", status: 404, message: "There is no such alert." };
  if ("delete" in change) {
    await alert.destroy();
    return { ok: true, value: null };
  }
  await alert.update(change);
  return { ok: true, value: alert };
}
