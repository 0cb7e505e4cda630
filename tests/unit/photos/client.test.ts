import { describe, expect, it } from "vitest";
import { applyArrange, moveId, planSelection } from "~/photos/client";
import type { PhotoView } from "~/photos/limits";

const limits = { maxPhotos: 24, maxBytes: 20 * 1024 * 1024 };

describe("uploader helpers", () => {
  it("sends only what fits the free places and the size limit, in the order chosen", () => {
    const plan = planSelection(
      [
        { name: "a.jpg", size: 1000 },
        { name: "b.jpg", size: 21 * 1024 * 1024 },
        { name: "c.jpg", size: 2000 },
        { name: "d.jpg", size: 3000 },
      ],
      2,
      limits,
    );
    expect(plan.map((p) => p.send)).toEqual([true, false, true, false]);
    expect(plan[1]).toEqual({ send: false, message: "This file is 21 MB; photos may be at most 20 MB." });
    expect(plan[3]).toEqual({
      send: false,
      message: "A listing can have 24 photos; this one was not sent. Delete one to make room.",
    });
  });

  it("moves one id and keeps the rest in order", () => {
    expect(moveId(["a", "b", "c", "d"], 0, 2)).toEqual(["b", "c", "a", "d"]);
    expect(moveId(["a", "b", "c", "d"], 3, 0)).toEqual(["d", "a", "b", "c"]);
  });

  it("redraws the list as the server will store it", () => {
    const p = (id: string, position: number, isCover = false): PhotoView => ({
      id,
      position,
      isCover,
      status: "ready",
      width: 1,
      height: 1,
      error: null,
      urls: null,
    });
    const list = { photos: [p("a", 0, true), p("b", 1), p("c", 2)], maxPhotos: 24, maxBytes: 1 };
    const next = applyArrange(list, { order: ["c", "a", "b"], coverId: "b" });
    expect(next.photos.map((x) => [x.id, x.position, x.isCover])).toEqual([
      ["c", 0, false],
      ["a", 1, false],
      ["b", 2, true],
    ]);
  });
});
