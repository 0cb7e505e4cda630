import { describe, expect, it } from "vitest";
import { runBatch } from "~/jobs/batch";

// A batch of fetched jobs: each runs in turn, and one that throws is failed alone so the others are
// still completed (and a mail waiting behind a broken job still goes out).
describe("a worker's batch of jobs", () => {
  it("runs every job in order and fails only the one that threw", async () => {
    const ran: string[] = [];
    const failed: [string, string][] = [];
    await runBatch(
      [
        { id: "a", data: 1 },
        { id: "b", data: 2 },
        { id: "c", data: 3 },
      ],
      async (data, id) => {
        ran.push(id);
        if (data === 2) throw new Error("the mail server refused it");
      },
      async (id, error) => failed.push([id, error.message]),
    );
    expect(ran).toEqual(["a", "b", "c"]);
    expect(failed).toEqual([["b", "the mail server refused it"]]);
  });
});
