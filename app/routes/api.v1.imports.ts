import type { Route } from "./+types/api.v1.imports";
import { requireRole } from "~/auth/guards.server";
import { apiRoute, json } from "~/http/api-route.server";
import { refusal } from "~/http/errors.server";
import { recentImports, startImport } from "~/imports/imports.server";
import { readCsvUpload } from "~/imports/upload.server";

// A workshop's CSV imports: the latest (GET) and a new one (POST, multipart with the file as `file`).
// A file with problems answers 400 `invalid` with one issue per problem, path `rows.<row>.<column>`
// (rows numbered as a spreadsheet shows them, the header is row 1), and nothing is written.
const route = apiRoute<Route.ActionArgs>({
  GET: async ({ request }) => {
    const user = await requireRole(request, "workshop");
    return json({ imports: await recentImports(user.id, 20) });
  },
  POST: async ({ request }) => {
    const user = await requireRole(request, "workshop");
    const { fileName, text } = await readCsvUpload(request);
    const started = await startImport(user.id, fileName, text);
    if (!started.ok) {
      const { problems, problemCount, rowsWithProblems } = started.check;
      throw refusal(
        "invalid",
        `${problemCount} problem${problemCount === 1 ? "" : "s"} in ${rowsWithProblems} row${rowsWithProblems === 1 ? "" : "s"}; nothing was imported.`,
        { issues: problems.map((p) => ({ path: `rows.${p.row}.${p.column}`, message: p.message })) },
      );
    }
    const status = started.import.status === "done" ? 201 : 202;
    return json({ import: started.import }, { status, headers: { Location: `/api/v1/imports/${started.import.id}` } });
  },
});
export const loader = route.loader;
export const action = route.action;
