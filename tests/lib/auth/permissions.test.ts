// The role → permission rules come from the product specification (issues 2, 5, 7 and 8 of
// this repository): admins manage members; designers create chips and upload; only fluidics
// reviewers review and only fab liaisons clear; leads read and share reports but change
// nothing; nobody reviews or clears their own upload (four-eyes, common practice in
// design sign-off).
import { describe, expect, it } from "vitest";
import { can, explainRefusal, PERMISSION_ROLES, type Actor, type Permission } from "@/lib/auth/permissions";
import { ROLES, type Role } from "@/lib/auth/roles";

const actor = (roles: Role[], userId = 1, workspaceId = 10): Actor => ({ userId, workspaceId, roles });

describe("can()", () => {
  it("lets only admins manage the workspace (issue 2: admins manage members, roles and invitations)", () => {
    for (const role of ROLES) expect(can(actor([role]), "workspace.manage")).toBe(role === "admin");
  });

  it("gives uploads only to designers and review/clearance only to their named roles (issues 5 and 7)", () => {
    const expected: Record<string, Role[]> = {
      "revision.upload": ["designer"],
      "chip.create": ["designer"],
      "revision.review": ["fluidics_reviewer"],
      "revision.clear": ["fab_liaison"],
    };
    for (const [perm, roles] of Object.entries(expected)) {
      for (const role of ROLES) expect(can(actor([role]), perm as Permission), `${role} ${perm}`).toBe(roles.includes(role));
    }
  });

  it("leaves the lead without any mutating permission except sharing a report (issue 8)", () => {
    const lead = actor(["lead"]);
    const mutating = (Object.keys(PERMISSION_ROLES) as Permission[]).filter((p) => !p.endsWith(".view") && p !== "token.manage" && p !== "comment.create");
    const leadMay = mutating.filter((p) => can(lead, p));
    expect(leadMay).toEqual(["report.share"]);
  });

  it("refuses everything for a signed-out or role-less actor", () => {
    for (const p of Object.keys(PERMISSION_ROLES) as Permission[]) {
      expect(can(null, p)).toBe(false);
      expect(can(actor([]), p)).toBe(false);
    }
  });

  it("refuses an object from another workspace even to a role that holds the permission", () => {
    expect(can(actor(["admin"]), "workspace.manage", { workspaceId: 10 })).toBe(true);
    expect(can(actor(["admin"]), "workspace.manage", { workspaceId: 11 })).toBe(false);
    expect(explainRefusal(actor(["admin"]), "workspace.manage", { workspaceId: 11 })).toMatch(/not a member/);
  });

  it("applies four-eyes: a reviewer who is also the uploader cannot review or clear (issue 7)", () => {
    const both = actor(["designer", "fluidics_reviewer", "fab_liaison"], 7);
    expect(can(both, "revision.review", { workspaceId: 10, createdByUserId: 7 })).toBe(false);
    expect(can(both, "revision.clear", { workspaceId: 10, createdByUserId: 7 })).toBe(false);
    expect(can(both, "revision.review", { workspaceId: 10, createdByUserId: 8 })).toBe(true);
    expect(explainRefusal(both, "revision.clear", { workspaceId: 10, createdByUserId: 7 })).toMatch(/uploaded yourself/);
  });

  it("lets only the uploader withdraw (issue 7: withdrawn by its designer)", () => {
    expect(can(actor(["designer"], 7), "revision.withdraw", { workspaceId: 10, createdByUserId: 7 })).toBe(true);
    expect(can(actor(["designer"], 8), "revision.withdraw", { workspaceId: 10, createdByUserId: 7 })).toBe(false);
  });

  it("unions the permissions of several roles held at once", () => {
    const a = actor(["lead", "designer"]);
    expect(can(a, "revision.upload")).toBe(true);
    expect(can(a, "report.share")).toBe(true);
    expect(can(a, "revision.review")).toBe(false);
  });

  it("names the needed role when refusing", () => {
    expect(explainRefusal(actor(["lead"]), "revision.upload")).toMatch(/designer role/);
  });
});
