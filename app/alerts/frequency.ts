// How often a spec alert mails: at once, in the daily digest, or not at all (what an unsubscribe link sets).
export const ALERT_FREQUENCIES = ["instant", "daily", "off"] as const;
export type AlertFrequency = (typeof ALERT_FREQUENCIES)[number];
