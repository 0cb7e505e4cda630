import { randomUUID } from "node:crypto";
import { sequelize } from "~/db.server";
import { User, Workshop, WorkshopApplication } from "~/models/index.server";
import { deletePrivateObject, putPrivateObject } from "~/services/private-storage.server";
import { DOCUMENT_PREFIX } from "~/workshops/document.server";
import { DEMO_WORKSHOPS } from "./demo-cast";
import { registrationPdf } from "./demo-documents";

// The demo's waiting workshops get an application on file (particulars and a registration document in
// the private bucket), so the desk's workshop page has something to open. Idempotent: a workshop that
// already has an application is left alone; the document is deleted again if its row is not written.

const PARTICULARS: Record<string, { address: string; registrationNumber: string }> = {
  "pennick-turntable-works": { address: "The Old Forge, 3 Tallowby Lane", registrationNumber: "ER-5520193" },
};

export async function seedDemoApplications(): Promise<{ created: number }> {
  let created = 0;
  for (const w of DEMO_WORKSHOPS.filter((d) => d.verifiedDaysAgo === null)) {
    const workshop = await Workshop.findOne({ where: { slug: w.slug }, include: [{ model: User, as: "owner", attributes: ["id"] }] });
    const particulars = PARTICULARS[w.slug];
    if (!workshop || !particulars || workshop.verificationStatus !== "applied") continue;
    if (await WorkshopApplication.count({ where: { workshopId: workshop.id } })) continue;
    const body = registrationPdf(`Eastreach register of trades: ${w.name}, no. ${particulars.registrationNumber}`);
    const key = `${DOCUMENT_PREFIX}demo/${randomUUID()}.pdf`;
    await putPrivateObject(key, body, "application/pdf");
    try {
      await sequelize.transaction(async (transaction) => {
        if (await WorkshopApplication.count({ where: { workshopId: workshop.id }, transaction })) throw new Already();
        await WorkshopApplication.create(
          {
            workshopId: workshop.id,
            applicantId: workshop.ownerId,
            businessName: w.name,
            address: particulars.address,
            registrationNumber: particulars.registrationNumber,
            documentKey: key,
            documentType: "application/pdf",
            documentName: "register-extract.pdf",
            documentBytes: body.length,
            createdAt: workshop.createdAt,
          },
          { transaction },
        );
      });
      created++;
    } catch (error) {
      await deletePrivateObject(key).catch(() => undefined);
      if (!(error instanceof Already)) throw error;
    }
  }
  return { created };
}

/** Another seeder wrote it first. */
class Already extends Error {}
