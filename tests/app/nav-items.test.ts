// The shell's navigation: a section shows only to roles whose permissions grant it (the
// permission table, from the product specification in issues 2, 5, 7 and 8) and only once its
// page exists (`ready`).
import { describe, expect, it } from "vitest";
import { NAV_ITEMS, navFor, type NavItem } from "@/components/shell/nav-items";
import type { Role } from "@/lib/auth/roles";

const actor = (roles: Role[]) => ({ userId: 1, workspaceId: 1, roles });

describe("navFor", () => {
  it("always offers the overview first, with the workspace slug in every link", () => {
    for (const role of ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"] as Role[]) {
      const nav = navFor(actor([role]), "brookmere");
      expect(nav[0]).toEqual({ key: "overview", label: "Overview", href: "/w/brookmere" });
      expect(nav.every((i) => i.href.startsWith("/w/brookmere"))).toBe(true);
    }
  });

  it("shows Admin to admins only", () => {
    expect(navFor(actor(["admin"]), "b").some((i) => i.key === "admin")).toBe(true);
    for (const role of ["designer", "fluidics_reviewer", "fab_liaison", "lead"] as Role[]) {
      expect(navFor(actor([role]), "b").some((i) => i.key === "admin")).toBe(false);
    }
  });

  it("hides sections whose page does not exist yet, and nothing at all to a member holding no role", () => {
    const items: NavItem[] = [
      { key: "overview", label: "Overview", path: "", permission: "workspace.view", ready: true },
      { key: "future", label: "Future", path: "/future", permission: "workspace.view", ready: false },
    ];
    expect(navFor(actor(["lead"]), "b", items).map((i) => i.key)).toEqual(["overview"]);
    expect(navFor(actor([]), "b")).toEqual([]);
  });

  it("lists each section once", () => {
    const keys = NAV_ITEMS.map((i) => i.key);
    expect(new Set(keys).size).toBe(keys.length);
  });
});
