import type { Route } from "./+types/import-file";
import { exampleCsv, templateCsv } from "~/imports/files";

// The import's two downloads, the same for everyone (they hold no one's data): the template (the header
// and a comment line) and an example with a few invented units.
export function loader({ request }: Route.LoaderArgs) {
  const example = new URL(request.url).pathname.endsWith("/example.csv");
  return new Response(example ? exampleCsv() : templateCsv(), {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${example ? "loadline-inventory-example.csv" : "loadline-inventory-template.csv"}"`,
      "Cache-Control": "public, max-age=3600",
    },
  });
}
