// Server actions of the chip and settings pages, called with FormData as React does, against a
// temporary database and storage folder; plus the demo seed step. Permission rules from
// lib/auth/permissions.ts (issue 5: fluids by designers/admins, process limits by fab liaisons,
// thresholds by fluidics reviewers). Flag rules and limits from lib/rules (sources there).
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
vi.mock("next/cache", () => ({ revalidatePath: vi.fn() }));
import { createChipAction, saveUnitPreferencesAction } from "@/app/(workspace)/w/[workspace]/chips/actions";
import { saveFluidAction, saveProcessAction, saveThresholdAction } from "@/app/(workspace)/w/[workspace]/settings/actions";
import { getAnalysis, getUserUnitPreferences, listChips, listRevisions } from "@/db/queries/chips";
import type { DemoContext } from "@/db/seed";
import { DEMO_CHIPS, seedChipsStep } from "@/db/seed-chips";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { requireMembership } from "@/lib/auth/require";
import { createOperatingPoint, saveLayerMap, uploadRevision } from "@/lib/chips/service";
import { listProcessOverrides, listThresholdOverrides, listWorkspaceFluids } from "@/lib/chips/settings";
import { PROCESS_PROFILES } from "@/lib/rules";
import { actAs } from "@/tests/support/fake-session";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

let demo: DemoContext;
let storageDir: string;
const u = (email: string) => demo.users[email];
const idle = { status: "idle" as const };
const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.append(k, v);
  return f;
};

beforeAll(async () => {
  demo = (await useTempDatabase())!;
  storageDir = mkdtempSync(path.join(tmpdir(), "stokeline-files-"));
  process.env.STORAGE_DIR = storageDir;
});
afterAll(() => {
  dropTempDatabase();
  rmSync(storageDir, { recursive: true, force: true });
});

describe("createChipAction", () => {
  it("refuses a lead and another company's member; nothing is stored", async () => {
    actAs(u("lead@brookmere.test"));
    expect(await createChipAction(idle, form({ workspace: "brookmere", name: "X", purpose: "" }))).toMatchObject({ status: "error", message: /designer role/ });
    actAs(u("designer@halvard.test"));
    expect(await createChipAction(idle, form({ workspace: "brookmere", name: "X", purpose: "" }))).toMatchObject({ status: "error", message: /not a member/ });
    const ctx = await (actAs(u("designer@brookmere.test")), requireMembership(demo.workspaces.brookmere.id, "chip.view"));
    expect(await listChips(ctx.scope)).toHaveLength(0);
  });

  it("names the field a designer must fix, then creates the chip and goes to its upload page", async () => {
    actAs(u("designer@brookmere.test"));
    const bad = await createChipAction(idle, form({ workspace: "brookmere", name: "  ", purpose: "" }));
    expect(bad).toMatchObject({ status: "error", fieldErrors: { name: "Give the chip a name." } });
    // Next's redirect() throws a signal whose digest carries the target; the wrapper lets it through.
    const err = await createChipAction(idle, form({ workspace: "brookmere", name: "Tee T-1", purpose: "test" })).catch((e: unknown) => e);
    const ctx = await requireMembership(demo.workspaces.brookmere.id, "chip.view");
    const [chip] = await listChips(ctx.scope);
    expect(chip.name).toBe("Tee T-1");
    expect(String((err as { digest?: string }).digest)).toContain(`/w/brookmere/chips/${chip.id}/upload?first=1`);
    // Same name again: a conflict in plain words.
    expect(await createChipAction(idle, form({ workspace: "brookmere", name: "Tee T-1", purpose: "" }))).toMatchObject({ status: "error", message: /already exists/ });
  });
});

describe("settings actions", () => {
  const fluid = {
    workspace: "brookmere",
    key: "test_oil",
    name: "Test oil",
    viscosity: "2 mPa*s",
    viscositySource: "datasheet",
    density: "900 kg/m^3",
    densitySource: "datasheet",
    surfaceTension: "25 mN/m",
    surfaceTensionSource: "datasheet",
  };

  it("fluids: designers and admins save; a lead is refused; a wrong unit is named", async () => {
    actAs(u("lead@brookmere.test"));
    expect((await saveFluidAction(idle, form(fluid))).status).toBe("error");
    actAs(u("designer@brookmere.test"));
    const bad = await saveFluidAction(idle, form({ ...fluid, viscosity: "2 kg" }));
    expect(bad.status).toBe("error");
    expect(Object.keys(bad.fieldErrors ?? {})).toEqual(["viscosity"]);
    expect((await saveFluidAction(idle, form(fluid))).status).toBe("ok");
    actAs(u("admin@brookmere.test"));
    expect((await saveFluidAction(idle, form({ ...fluid, name: "Test oil (edited)" }))).status).toBe("ok");
    const ctx = await requireMembership(demo.workspaces.brookmere.id, "settings.view");
    const fluids = await listWorkspaceFluids(ctx.scope);
    expect(fluids.map((f) => [f.key, f.name, f.viscosity, f.sources.viscosity])).toEqual([["test_oil", "Test oil (edited)", "2 mPa*s", "datasheet"]]);
  });

  it("thresholds: only fluidics reviewers, only rules with a threshold, a note is required; empty resets", async () => {
    actAs(u("designer@brookmere.test"));
    expect(await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "re_inertial", value: "5", note: "n" }))).toMatchObject({ status: "error", message: /fluidics reviewer/ });
    actAs(u("reviewer@brookmere.test"));
    expect(await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "pressure_bond", value: "5", note: "n" }))).toMatchObject({ status: "error", message: /Process profiles/ });
    expect(await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "re_inertial", value: "-1", note: "n" }))).toMatchObject({ status: "error", message: /positive/ });
    const noNote = await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "re_inertial", value: "5", note: "" }));
    expect(noNote).toMatchObject({ status: "error", message: /Say why/, values: { value: "5" } });
    expect((await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "re_inertial", value: "5", note: "bench data" }))).status).toBe("ok");
    const ctx = await requireMembership(demo.workspaces.brookmere.id, "settings.view");
    expect((await listThresholdOverrides(ctx.scope)).re_inertial).toMatchObject({ value: 5, note: "bench data" });
    expect((await saveThresholdAction(idle, form({ workspace: "brookmere", ruleCode: "re_inertial", value: "", note: "" }))).status).toBe("ok");
    expect((await listThresholdOverrides(ctx.scope)).re_inertial).toBeUndefined();
  });

  it("process limits: only fab liaisons; typed in kPa/µm/mm, stored in SI", async () => {
    actAs(u("reviewer@brookmere.test"));
    expect((await saveProcessAction(idle, form({ workspace: "brookmere", processKey: "pdms_soft_lithography", maxWorkingPressurePa: "150", note: "x" }))).status).toBe("error");
    actAs(u("fab@brookmere.test"));
    expect(await saveProcessAction(idle, form({ workspace: "brookmere", processKey: "pdms_soft_lithography", maxWorkingPressurePa: "abc", note: "x" }))).toMatchObject({ status: "error", message: /positive number in kPa/ });
    expect(await saveProcessAction(idle, form({ workspace: "brookmere", processKey: "pdms_soft_lithography", maxWorkingPressurePa: "150", note: "" }))).toMatchObject({ status: "error", message: /where your fab/ });
    expect(
      (await saveProcessAction(idle, form({ workspace: "brookmere", processKey: "pdms_soft_lithography", maxWorkingPressurePa: "150", minFeatureM: "25", edgeMarginM: "1.5", note: "burst tests" }))).status,
    ).toBe("ok");
    const ctx = await requireMembership(demo.workspaces.brookmere.id, "settings.view");
    const o = (await listProcessOverrides(ctx.scope)).pdms_soft_lithography;
    expect(o.values.maxWorkingPressurePa).toBeCloseTo(150e3, 6);
    expect(o.values.minFeatureM).toBeCloseTo(25e-6, 12);
    expect(o.values.edgeMarginM).toBeCloseTo(1.5e-3, 12);
    // In another workspace too, only its fab liaisons may: a Halvard designer is refused.
    actAs(u("designer@halvard.test"));
    expect((await saveProcessAction(idle, form({ workspace: "halvard", processKey: "pdms_soft_lithography", maxWorkingPressurePa: "1", note: "x" }))).status).toBe("error");
  });

  it("a fab liaison's lowered bond limit reaches the next analysis as a flag", async () => {
    actAs(u("designer@brookmere.test"));
    const designer = await requireMembership(demo.workspaces.brookmere.id, "revision.upload");
    const [chip] = await listChips(designer.scope);
    const bytes = readFileSync(new URL("../fixtures/layouts/tee-um-r2000.dxf", import.meta.url));
    await uploadRevision(designer, chip.id, { fileName: "tee.dxf", bytes, note: "" });
    await saveLayerMap(designer, chip.id, 1, {
      layers: { FLOW: { role: "channel", depth: "50 um", width: "100 um" }, PORTS: { role: "port" }, TEXT: { role: "ignore" } },
    });
    const op = {
      name: "nominal",
      fluid: "preset:water",
      temperature: "25 degC",
      process: "pdms_soft_lithography",
      cells: false,
      ports: [
        { name: "A", drive: "flow" as const, value: "10 uL/min" },
        { name: "B", drive: "pressure" as const, value: "0 mbar" },
        { name: "C", drive: "pressure" as const, value: "0 mbar" },
      ],
    };
    const before = await createOperatingPoint(designer, chip.id, 1, op);
    const first = (await getAnalysis(designer.scope, before.analysisId))!;
    const result = first.result as unknown as AnalyzeJson;
    const inletPa = result.ports.find((p) => p.name === "A")!.pressure_Pa!;
    // 150 kPa from the previous test is far above this inlet pressure: no bond flag; the stored conditions carry the override.
    expect(result.flags.map((f) => f.code)).not.toContain("pressure_bond");
    expect((first.conditions as { thresholds?: Record<string, number> }).thresholds?.pressure_bond).toBeCloseTo(150e3, 6);
    // The fab liaison lowers the limit below the inlet pressure (kPa in the form).
    actAs(u("fab@brookmere.test"));
    expect((await saveProcessAction(idle, form({ workspace: "brookmere", processKey: "pdms_soft_lithography", maxWorkingPressurePa: String(inletPa / 2 / 1e3), note: "test" }))).status).toBe("ok");
    actAs(u("designer@brookmere.test"));
    const after = await createOperatingPoint(designer, chip.id, 1, { ...op, name: "after override" });
    const flags = ((await getAnalysis(designer.scope, after.analysisId))!.result as unknown as AnalyzeJson).flags;
    const bond = flags.find((f) => f.code === "pressure_bond");
    expect(bond).toBeDefined();
    expect(bond!.threshold).toBeCloseTo(inletPa / 2, 6);
    // The default is untouched for other workspaces' analyses: the profile itself is unchanged.
    expect(PROCESS_PROFILES.pdms_soft_lithography.maxWorkingPressurePa).toBe(200e3);
  });
});

describe("saveUnitPreferencesAction", () => {
  it("stores the member's units and refuses a unit the catalogue does not offer", async () => {
    actAs(u("reviewer@brookmere.test"));
    await saveUnitPreferencesAction({ pressure: "kPa", length: "mm" } as never);
    expect(await getUserUnitPreferences(u("reviewer@brookmere.test"))).toEqual({ pressure: "kPa", length: "mm" });
    await expect(saveUnitPreferencesAction({ pressure: "furlong" } as never)).rejects.toThrow();
    actAs(null);
    await expect(saveUnitPreferencesAction({ pressure: "kPa" } as never)).rejects.toThrow(/Sign in/);
  });
});

describe("seedChipsStep", () => {
  it("adds the three demo chips with two analysed revisions each, uploaded by the demo designer", async () => {
    await seedChipsStep.run(demo);
    actAs(u("lead@brookmere.test"));
    const ctx = await requireMembership(demo.workspaces.brookmere.id, "chip.view");
    const chips = (await listChips(ctx.scope)).filter((c) => DEMO_CHIPS.some((d) => d.name === c.name));
    expect(chips.map((c) => c.name).sort()).toEqual(DEMO_CHIPS.map((d) => d.name).sort());
    for (const chip of chips) {
      expect(chip.latestRevision).toBe(2);
      const revisions = await listRevisions(ctx.scope, chip.id);
      expect(revisions.map((r) => r.uploaderName)).toEqual(["Tobiah Quill", "Tobiah Quill"]);
      for (const r of revisions) expect(r.analysisCount).toBeGreaterThanOrEqual(1);
      expect(chip.worstSeverity).not.toBeNull();
    }
  });
});
