import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { account, cleanUp, liveAmplifier, unsubscribeToken, type SentMail } from "./alerts-support";
import { signedInCookie } from "../support/sessions";
import { routeArgs } from "../support/route-args";
import { call } from "./listing-support";

// Spec alerts through their route modules (save, rename, frequency, delete; someone else's alert is
// a 404), and the unsubscribe link: no account needed, GET only asks, POST stops, a wrong token 404s.
const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { SpecAlert } = await import("~/models/spec-alert.server");
const { mailAlertHits } = await import("~/alerts/alert-mail.server");
const newAlert = await import("~/routes/alerts/new");
const alertsPage = await import("~/routes/alerts/alerts");
const unsubscribePage = await import("~/routes/alerts/unsubscribe");

const BASE = "http://127.0.0.1";
let buyer: Awaited<ReturnType<typeof account>>;
let other: Awaited<ReturnType<typeof account>>;
let cookie: string;
let otherCookie: string;

function get(path: string, withCookie: string | null) {
  return routeArgs(new Request(BASE + path, { headers: withCookie ? { Cookie: withCookie } : {} }), {});
}
function post(path: string, fields: Record<string, string>, withCookie: string | null) {
  const headers: Record<string, string> = { "Content-Type": "application/x-www-form-urlencoded" };
  if (withCookie) headers.Cookie = withCookie;
  return routeArgs(new Request(BASE + path, { method: "POST", body: new URLSearchParams(fields), headers }), {});
}
/** The unsubscribe page as a mail reader reaches it: no cookie. */
function openLink(token: string, method: "GET" | "POST" = "GET", body = "") {
  const init: RequestInit =
    method === "POST" ? { method, body, headers: { "Content-Type": "application/x-www-form-urlencoded" } } : { method };
  return routeArgs(new Request(`${BASE}/unsubscribe/${token}`, init), { token });
}

beforeAll(async () => {
  buyer = await account("page-buyer");
  other = await account("page-other");
  cookie = await signedInCookie(buyer);
  otherCookie = await signedInCookie(other);
});
beforeEach(() => {
  sent.length = 0;
});
afterAll(async () => {
  await cleanUp();
  await sequelize.close();
});

describe("saving and managing spec alerts", () => {
  it("sends a visitor to sign in and back to the same filters", async () => {
    const out = await call(() => newAlert.loader(get("/alerts/new?category=amplifiers", null)));
    expect(out.status).toBe(302);
    const thrown = await newAlert.loader(get("/alerts/new?category=amplifiers", null)).catch((r: Response) => r);
    expect((thrown as Response).headers.get("Location")).toBe(
      `/sign-in?redirectTo=${encodeURIComponent("/alerts/new?category=amplifiers")}`,
    );
  });

  it("saves the filters with a name and a frequency; a blank name is refused next to its field", async () => {
    const refused = await call(() => newAlert.action(post("/alerts/new", { name: "  ", frequency: "daily", query: "" }, cookie)));
    expect(refused.status).toBe(400);
    expect(refused.body.fields.name).toMatch(/name/i);
    const badFrequency = await call(() =>
      newAlert.action(post("/alerts/new", { name: "Big amps", frequency: "weekly", query: "" }, cookie)),
    );
    expect(badFrequency.status).toBe(400);
    expect(Object.keys(badFrequency.body.fields)).toEqual(["frequency"]);

    const saved = await newAlert.action(post("/alerts/new", { name: "Big amps", frequency: "daily", query: "page=3" }, cookie));
    expect(saved).toBeInstanceOf(Response);
    const alert = (await SpecAlert.findOne({ where: { userId: buyer.id, name: "Big amps" } }))!;
    expect((saved as Response).headers.get("Location")).toBe(`/alerts?saved=${alert.id}`);
    expect(alert.frequency).toBe("daily");
    // Paging is not part of what an alert watches for.
    expect(alert.query).not.toContain("page=");
    const page = await call(() => alertsPage.loader(get("/alerts", cookie)));
    expect(page.body.alerts.map((a: { name: string }) => a.name)).toEqual(["Big amps"]);
  });

  it("renames, changes the frequency and deletes the buyer's own alert; another buyer's is a 404", async () => {
    const alert = await SpecAlert.create({ userId: buyer.id, name: "Phono stages", query: "", frequency: "instant" });
    const ask = (fields: Record<string, string>, who = cookie) =>
      call(() => alertsPage.action(post("/alerts", { alertId: alert.id, ...fields }, who)));

    expect((await ask({ intent: "rename", name: "Quiet phono stages" }, otherCookie)).status).toBe(404);
    expect((await ask({ intent: "frequency", frequency: "off" }, otherCookie)).status).toBe(404);
    expect((await ask({ intent: "delete" }, otherCookie)).status).toBe(404);
    await alert.reload();
    expect([alert.name, alert.frequency]).toEqual(["Phono stages", "instant"]);

    expect((await ask({ intent: "rename", name: "" })).body).toMatchObject({ alertId: alert.id, field: "name" });
    expect((await ask({ intent: "rename", name: "Quiet phono stages" })).status).toBe(200);
    expect((await ask({ intent: "frequency", frequency: "daily" })).status).toBe(200);
    await alert.reload();
    expect([alert.name, alert.frequency]).toEqual(["Quiet phono stages", "daily"]);
    expect((await ask({ intent: "delete" })).status).toBe(200);
    expect(await SpecAlert.findByPk(alert.id)).toBeNull();
  });
});

describe("the unsubscribe link", () => {
  async function mailedAlert() {
    const seller = await account(`seller-${Math.random().toString(36).slice(2, 8)}`, ["buyer", "seller"]);
    const listing = await liveAmplifier(seller.id);
    const alert = await SpecAlert.create({ userId: buyer.id, name: "Amplifiers", query: "", frequency: "instant" });
    await mailAlertHits({ id: buyer.id, email: buyer.email, displayName: buyer.displayName }, [
      { alertId: alert.id, alertName: alert.name, query: "", listing },
    ]);
    return { alert, token: unsubscribeToken(sent.at(-1)!) };
  }

  it("opening it without an account shows what it stops and stops nothing; the POST stops that alert", async () => {
    const { alert, token } = await mailedAlert();
    const other = await SpecAlert.create({ userId: buyer.id, name: "Tape decks", query: "", frequency: "daily" });
    const shown = await call(() => unsubscribePage.loader(openLink(token)));
    expect(shown.status).toBe(200);
    expect(shown.body.target).toEqual({ kind: "alert", alertName: "Amplifiers", stopped: false });
    expect((await alert.reload()).frequency).toBe("instant");

    const done = await call(() => unsubscribePage.action(openLink(token, "POST")));
    expect(done.body).toEqual({ target: { kind: "alert", alertName: "Amplifiers", stopped: true }, done: true });
    expect((await alert.reload()).frequency).toBe("off");
    expect((await other.reload()).frequency).toBe("daily");
    // The link keeps working (the same answer), as a second click in the mail would.
    expect((await call(() => unsubscribePage.action(openLink(token, "POST")))).status).toBe(200);
  });

  it("takes a mail client's one-click POST (RFC 8058) from another server", async () => {
    const { alert, token } = await mailedAlert();
    expect((await call(() => unsubscribePage.action(openLink(token, "POST", "List-Unsubscribe=One-Click")))).status).toBe(200);
    expect((await alert.reload()).frequency).toBe("off");
  });

  it("answers 404 to a wrong, malformed or expired token, for GET and POST", async () => {
    const { token } = await mailedAlert();
    const wrong = token.slice(0, -1) + (token.endsWith("A") ? "B" : "A");
    for (const t of [wrong, "not-a-token", ""]) {
      expect((await call(() => unsubscribePage.loader(openLink(t)))).status).toBe(404);
      expect((await call(() => unsubscribePage.action(openLink(t, "POST")))).status).toBe(404);
    }
    await sequelize.query(`UPDATE unsubscribe_tokens SET expires_at = now() - interval '1 second' WHERE user_id = :id`, {
      replacements: { id: buyer.id },
    });
    expect((await call(() => unsubscribePage.loader(openLink(token)))).status).toBe(404);
  });

  it("stores only the token's hash", async () => {
    const { token } = await mailedAlert();
    const [rows] = await sequelize.query(`SELECT token_hash FROM unsubscribe_tokens WHERE user_id = :id`, {
      replacements: { id: buyer.id },
    });
    const hashes = (rows as { token_hash: string }[]).map((r) => r.token_hash);
    expect(hashes).not.toContain(token);
    const { hashToken } = await import("~/auth/tokens.server");
    expect(hashes).toContain(hashToken(token));
  });
});
