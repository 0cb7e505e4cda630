import { describe, expect, it } from "vitest";
import { parentRouteIds } from "~/components/parent-route-ids";

// The routes a page names for its first navigations (PaintFirstScripts): those of every parent path.
const tree = (prefix: string) => [
  {
    id: `${prefix}root`,
    path: "/",
    children: [
      { id: `${prefix}home`, index: true },
      { id: `${prefix}listings`, path: "listings" },
      { id: `${prefix}listing`, path: "listings/:id" },
      { id: `${prefix}report`, path: "listings/:id/report" },
    ],
  },
];

describe("parentRouteIds", () => {
  const build = {};
  it("names the routes of each parent path, the page's own path left out", () => {
    // "/", then the parents from the nearest up: "/listings/a1", "/listings".
    expect(parentRouteIds(build, tree(""), "/listings/a1/report")).toEqual(["root", "home", "root", "listing", "root", "listings"]);
    expect(parentRouteIds(build, tree(""), "/market")).toEqual(["root", "home"]);
  });

  it("answers each build from its own routes, however often a path was asked before", () => {
    expect(parentRouteIds(build, tree(""), "/listings/b2")).toEqual(["root", "home", "root", "listings"]);
    const next = {};
    expect(parentRouteIds(next, tree("next:"), "/listings/b2")).toEqual(["next:root", "next:home", "next:root", "next:listings"]);
    expect(parentRouteIds(build, tree(""), "/listings/b2")).toEqual(["root", "home", "root", "listings"]);
  });

  it("matches a path once per build", () => {
    const once = {};
    const routes = tree("");
    expect(parentRouteIds(once, routes, "/listings/d4")).toEqual(["root", "home", "root", "listings"]);
    routes[0].children.splice(2, 1); // "listings" gone: a kept answer does not look again
    expect(parentRouteIds(once, routes, "/listings/d4")).toEqual(["root", "home", "root", "listings"]);
  });

  it("matches under the basename", () => {
    // "/" lies outside the basename and matches nothing; "/shop/listings", then "/shop" (the root's index).
    expect(parentRouteIds(build, tree(""), "/shop/listings/c3", "/shop")).toEqual(["root", "listings", "root", "home"]);
  });
});
