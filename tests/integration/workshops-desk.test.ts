import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { randomBytes } from "node:crypto";
import type { SentMail } from "./talk-support";

// The desk's side of workshop applications: the queue's rows, the item page (claimed on opening, the
// document behind a link signed for the viewer), verify and refuse with a required note under the
// moderator's claim: the workshop, the application, the applicant's role, the audit record and the
// applicant's mail all change together, and a second moderator or a second decision changes nothing.

const sent: SentMail[] = [];
vi.mock("~/services/mail.server", () => ({
  sendMail: async (mail: SentMail) => {
    sent.push(mail);
    return { messageId: `test-${sent.length}` };
  },
}));

const { sequelize } = await import("~/db.server");
const { AuditRecord, User, Workshop, WorkshopApplication } = await import("~/models/index.server");
const { ensureBucket } = await import("~/services/storage.server");
const { QUEUES, getBoss } = await import("~/services/jobs.server");
const { submitApplication, applicationState } = await import("~/workshops/apply.server");
const { workshopApplicationItems } = await import("~/workshops/desk.server");
const { deskWorkshopPage, decideFromDesk } = await import("~/workshops/desk-page.server");
const { deliverWorkshopMail } = await import("~/workshops/mail.server");
const { documentResponse } = await import("~/workshops/document-response.server");
const { CLAIM_MINUTES } = await import("~/desk/claims.server");
const { testClock } = await import("../support/clock");
const { registrationPdf } = await import("../support/document-files");
const { runQueue } = await import("./talk-support");

const RUN = randomBytes(4).toString("hex");
let n = 0;
async function person(label: string, roles: ("buyer" | "seller" | "moderator")[]) {
  n++;
  return User.create({
    email: `workshops-desk-${RUN}-${label}-${n}@example.test`,
    displayName: `Desk ${label} ${n}`,
    passwordHash: null,
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
}
const asViewer = (u: InstanceType<typeof User>) => ({
  id: u.id,
  email: u.email,
  displayName: u.displayName,
  roles: u.roles,
  emailVerified: true,
});

async function applied(label: string) {
  const applicant = await person(label, ["buyer", "seller"]);
  const form = new FormData();
  const fields = {
    businessName: `Kestermoor Valve Works ${RUN} ${label}`,
    address: "2 Kiln Row",
    town: "Kestermoor",
    region: "",
    country: "NL",
    registrationNumber: `HV-${n}-${RUN}`,
  };
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append("document", new File([new Uint8Array(registrationPdf())], "kvk.pdf", { type: "application/pdf" }));
  const result = await submitApplication(
    new Request("http://loadline.test/account/workshop", { method: "POST", body: form }),
    applicant.id,
  );
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return { applicant, application: result.application, workshopId: result.application.workshopId };
}

async function mailJobs(applicationId: string) {
  const [rows] = await sequelize.query(`SELECT id FROM pgboss.job WHERE name = $1 AND data->>'applicationId' = $2`, {
    bind: [QUEUES.workshopMail, applicationId],
  });
  return rows.length;
}

let mossy: InstanceType<typeof User>;
let wren: InstanceType<typeof User>;
beforeAll(async () => {
  await ensureBucket();
  // Started first: on a fresh database pg-boss makes its schema as it starts.
  await getBoss();
  mossy = await person("moderator", ["buyer", "moderator"]);
  wren = await person("moderator", ["buyer", "moderator"]);
});
afterAll(() => sequelize.close());

describe("workshop applications on the desk", () => {
  it("lists a waiting application in the queue since it was sent, linking its page", async () => {
    const { workshopId, application } = await applied("queue");
    const items = await workshopApplicationItems(1000);
    const item = items.find((i) => i.subject.id === workshopId);
    expect(item).toMatchObject({
      kind: "workshop_application",
      subject: { type: "workshop", id: workshopId },
      href: `/desk/workshops/${workshopId}`,
      since: application.createdAt,
    });
    expect(item?.summary).toContain(`registration ${application.registrationNumber}`);
    // Oldest first.
    const times = items.map((i) => i.since.getTime());
    expect([...times].sort((a, b) => a - b)).toEqual(times);
  });

  it("verifies with a note: one transaction changes the workshop, the application, the role, the trail and queues one mail", async () => {
    const { applicant, workshopId, application } = await applied("verify");
    const clock = testClock(new Date());
    const page = await deskWorkshopPage(asViewer(mossy), workshopId, clock);
    expect(page.claim).toEqual({ mine: true });
    expect(page.applications.map((a) => a.status)).toEqual(["waiting"]);
    // The page's link is signed for this moderator and opens the document.
    const href = new URL(page.applications[0].document.href, "http://loadline.test");
    expect((await documentResponse(href, application.id, mossy.id, clock)).status).toBe(200);

    // The other moderator sees who has it, and cannot act.
    const other = await deskWorkshopPage(asViewer(wren), workshopId, clock);
    expect(other.claim).toMatchObject({ mine: false, by: mossy.displayName });
    const taken = await decideFromDesk(asViewer(wren), workshopId, { decision: "verify", note: "Register extract matches." }, clock);
    expect(taken).toMatchObject({ ok: false, status: 409, errors: { _form: expect.stringContaining(`Taken by ${mossy.displayName}`) } });

    // A note is required.
    const bare = await decideFromDesk(asViewer(mossy), workshopId, { decision: "verify", note: "  " }, clock);
    expect(bare).toMatchObject({ ok: false, status: 400, errors: { note: expect.stringMatching(/note/) } });
    expect(await AuditRecord.count({ where: { subjectType: "workshop", subjectId: workshopId } })).toBe(0);
    expect((await WorkshopApplication.findByPk(application.id))?.status).toBe("waiting");
    expect(await mailJobs(application.id)).toBe(0);

    const done = await decideFromDesk(
      asViewer(mossy),
      workshopId,
      { decision: "verify", note: "Register extract matches the address." },
      clock,
    );
    expect(done).toEqual({ ok: true });
    const after = await WorkshopApplication.findByPk(application.id, { rejectOnEmpty: true });
    expect(after).toMatchObject({ status: "verified", decidedBy: mossy.id, decisionNote: "Register extract matches the address." });
    expect(after.decidedAt?.toISOString()).toBe(clock.now().toISOString());
    const workshop = await Workshop.findByPk(workshopId, { rejectOnEmpty: true });
    expect(workshop.verificationStatus).toBe("verified");
    expect(workshop.verifiedAt?.toISOString()).toBe(clock.now().toISOString());
    expect((await User.findByPk(applicant.id))?.roles).toContain("workshop");
    const trail = await AuditRecord.findAll({ where: { subjectType: "workshop", subjectId: workshopId } });
    expect(trail.map((r) => [r.action, r.actorId, r.note])).toEqual([
      ["verify_workshop", mossy.id, "Register extract matches the address."],
    ]);
    expect(trail[0].before).toEqual({ workshop: "applied", application: "waiting" });
    expect(trail[0].after).toMatchObject({ workshop: "verified", application: "verified" });
    expect(await mailJobs(application.id)).toBe(1);
    // The claim went with the action.
    const [claims] = await sequelize.query(`SELECT 1 FROM desk_claims WHERE subject_type = 'workshop' AND subject_id = $1`, {
      bind: [workshopId],
    });
    expect(claims).toHaveLength(0);

    // Decided: a second decision (even by the same moderator) is refused and writes nothing.
    const again = await decideFromDesk(asViewer(mossy), workshopId, { decision: "refuse", note: "Changed my mind." }, clock);
    expect(again).toMatchObject({ ok: false, status: 409 });
    expect(await AuditRecord.count({ where: { subjectType: "workshop", subjectId: workshopId } })).toBe(1);
    expect((await deskWorkshopPage(asViewer(wren), workshopId, clock)).trail.map((t) => t.note)).toEqual([
      "Register extract matches the address.",
    ]);

    // The applicant's mail goes once, with the note, however often the job runs.
    const before = sent.length;
    await runQueue(QUEUES.workshopMail, deliverWorkshopMail);
    const mine = sent.slice(before).filter((m) => m.to === applicant.email);
    expect(mine).toHaveLength(1);
    expect(mine[0].subject).toMatch(/^Verified: /);
    expect(mine[0].text).toContain("Register extract matches the address.");
    expect(await deliverWorkshopMail({ applicationId: application.id })).toBe("already");
  });

  it("refuses with a note; the applicant may apply again and the earlier application stays on file", async () => {
    const { applicant, workshopId } = await applied("refuse");
    const clock = testClock(new Date());
    await deskWorkshopPage(asViewer(wren), workshopId, clock);
    const done = await decideFromDesk(
      asViewer(wren),
      workshopId,
      { decision: "refuse", note: "The document is a utility bill, not a register extract." },
      clock,
    );
    expect(done).toEqual({ ok: true });
    expect((await Workshop.findByPk(workshopId))?.verificationStatus).toBe("rejected");
    expect((await User.findByPk(applicant.id))?.roles).not.toContain("workshop");
    const state = await applicationState(applicant.id);
    expect(state).toMatchObject({ stage: "refused", mayApply: true });
    expect(state.latest?.decisionNote).toBe("The document is a utility bill, not a register extract.");
    const trail = await AuditRecord.findAll({ where: { subjectType: "workshop", subjectId: workshopId } });
    expect(trail.map((r) => r.action)).toEqual(["refuse_workshop"]);
    await runQueue(QUEUES.workshopMail, deliverWorkshopMail);
    expect(sent.filter((m) => m.to === applicant.email).map((m) => m.subject)).toEqual([
      expect.stringMatching(/^Your workshop application/),
    ]);

    // Applying again re-opens the same workshop with a new application beside the refused one.
    const form = new FormData();
    for (const [k, v] of Object.entries({
      businessName: "Kestermoor Valve Works Again",
      address: "2 Kiln Row",
      town: "Kestermoor",
      region: "",
      country: "NL",
      registrationNumber: "HV-77120",
    }))
      form.append(k, v);
    form.append(
      "document",
      new File([new Uint8Array(registrationPdf("Trade register extract, no. HV-77120"))], "extract.pdf", { type: "application/pdf" }),
    );
    const again = await submitApplication(
      new Request("http://loadline.test/account/workshop", { method: "POST", body: form }),
      applicant.id,
    );
    expect(again.ok).toBe(true);
    expect((await Workshop.findByPk(workshopId))?.verificationStatus).toBe("applied");
    const page = await deskWorkshopPage(asViewer(mossy), workshopId, clock);
    expect(page.applications.map((a) => a.status)).toEqual(["waiting", "refused"]);
  });

  it("a claim left alone lapses: after it, the other moderator may act", async () => {
    const { workshopId } = await applied("lapse");
    const clock = testClock(new Date());
    await deskWorkshopPage(asViewer(mossy), workshopId, clock);
    clock.advanceMinutes(CLAIM_MINUTES - 1);
    expect(await decideFromDesk(asViewer(wren), workshopId, { decision: "verify", note: "Checked the register." }, clock)).toMatchObject({
      ok: false,
      status: 409,
    });
    clock.advanceMinutes(1);
    expect(await decideFromDesk(asViewer(wren), workshopId, { decision: "verify", note: "Checked the register." }, clock)).toEqual({
      ok: true,
    });
  });
});
