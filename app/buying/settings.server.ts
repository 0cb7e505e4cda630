import { User } from "~/models/index.server";
import { marketplaceSettings, updateMarketplaceSettings } from "~/orders/settings.server";
import { settingsFormValues, type MarketplaceSettingsInput } from "./settings-form";

// The admin page's side of marketplace_settings: the stored row as form values (and who changed it
// last), and the save.

export async function loadSettingsForAdmin() {
  const s = await marketplaceSettings();
  const by = s.updatedBy ? await User.findByPk(s.updatedBy, { attributes: ["displayName"] }) : null;
  return {
    values: settingsFormValues(s),
    updated: s.updatedBy ? { at: s.updatedAt.toISOString(), by: by?.displayName ?? null } : null,
  };
}

export async function saveSettingsAsAdmin(adminId: string, v: MarketplaceSettingsInput): Promise<void> {
  await updateMarketplaceSettings(v, adminId);
}
