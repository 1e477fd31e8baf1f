/**
 * The command line: one JSON document on stdout; exit 0, 2 on bad input
 * (a DomainError as {"ok":false,"error":{code,message}}), never a stack trace.
 * Goes through analyzeLayout (lib/analysis/analyze.ts), the same function the web app calls.
 */
import { execFileSync, spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { runCli } from "@/lib/cli/main";

const fixture = (f: string) => fileURLToPath(new URL(`../../fixtures/layouts/${f}`, import.meta.url));
const root = fileURLToPath(new URL("../../../", import.meta.url));
const tmp = mkdtempSync(join(tmpdir(), "stokeline-cli-"));

async function run(args: string[]): Promise<{ code: number; doc: Record<string, unknown>; text: string }> {
  let text = "";
  const code = await runCli(args, (t) => (text += t));
  return { code, doc: JSON.parse(text), text };
}

function conditionsFile(name: string, doc: unknown): string {
  const p = join(tmp, name);
  writeFileSync(p, JSON.stringify(doc));
  return p;
}

const crossConditions = {
  layers: { FLOW: { role: "channel", width: "100 um", depth: "50 um" }, PORTS: { role: "port" }, CTRL: { role: "control" }, TEXT: { role: "ignore" } },
  fluid: { preset: "water" },
  ports: { W: { pressure: "100 mbar" }, E: { pressure: 0 }, N: { pressure: 0 }, S: { pressure: 0 } },
};

describe("stokeline analyze", () => {
  it("prints the analyze document; the cross junction's pressure follows the conductance split", async () => {
    const { code, doc } = await run(["analyze", fixture("cross-r2000.dxf"), "--conditions", conditionsFile("cross.json", crossConditions)]);
    expect(code).toBe(0);
    expect(doc.ok).toBe(true);
    const segments = doc.segments as { length_m: number; from: string; to: string }[];
    expect(segments.map((s) => s.length_m).sort()).toEqual([0.0025, 0.0035, 0.0035, 0.0045].map((v) => expect.closeTo(v, 12)));
    // Same section everywhere, so conductance ∝ 1/length; Kirchhoff at the junction with 10 kPa at W and 0 at E, N, S:
    // p_j = (p_W / L_W) / (1/L_W + 1/L_E + 1/L_N + 1/L_S) (closed form).
    const lw = 2.5e-3, le = 4.5e-3, ln = 3.5e-3, ls = 3.5e-3;
    const pj = (1e4 / lw) / (1 / lw + 1 / le + 1 / ln + 1 / ls);
    const junction = (doc.nodes as { kind: string; pressure_Pa?: number }[]).find((n) => n.kind === "junction")!;
    expect(junction.pressure_Pa!).toBeCloseTo(pj, 6);
    expect(Array.isArray(doc.cautions)).toBe(true);
  });

  it("geometry only when no port is driven", async () => {
    const { code, doc } = await run(["analyze", fixture("straight-r2000.dxf"), "--conditions", conditionsFile("geo.json", { layers: crossConditions.layers })]);
    expect(code).toBe(0);
    expect(doc.totals).toBeNull();
    expect((doc.segments as unknown[]).length).toBe(1);
  });

  it("bad input: exit 2 with code and message, and the layers when the file was readable", async () => {
    const noChannel = await run(["analyze", fixture("straight-r2000.dxf"), "--conditions", conditionsFile("nc.json", { layers: { FLOW: { role: "control" } } })]);
    expect(noChannel.code).toBe(2);
    expect(noChannel.doc).toMatchObject({ ok: false, error: { code: "no_channel_layer" } });
    expect(((noChannel.doc.error as { layers: { name: string }[] }).layers).map((l) => l.name)).toContain("FLOW");
    const missing = await run(["analyze", join(tmp, "nope.dxf")]);
    expect(missing.code).toBe(2);
    expect(missing.doc).toMatchObject({ ok: false, error: { code: "file_unreadable" } });
    const badJson = join(tmp, "bad.json");
    writeFileSync(badJson, "{ not json");
    expect((await run(["analyze", fixture("straight-r2000.dxf"), "--conditions", badJson])).doc).toMatchObject({ error: { code: "invalid_conditions_json" } });
    const badConditions = await run(["analyze", fixture("straight-r2000.dxf"), "--conditions", conditionsFile("bq.json", { snap: "5 mbar" })]);
    expect(badConditions.code).toBe(2);
    expect(badConditions.doc).toMatchObject({ ok: false, error: { code: "wrong_dimension" } });
    expect((await run(["frobnicate"])).doc).toMatchObject({ ok: false, error: { code: "usage" } });
  });
});

describe("stokeline layers", () => {
  it("lists layers with entity counts and proposed roles", async () => {
    const { code, doc } = await run(["layers", fixture("cross-r2000.dxf")]);
    expect(code).toBe(0);
    expect(doc.units).toEqual({ drawing: "um", source: "$INSUNITS" });
    expect(doc.layers).toEqual([
      { name: "CTRL", role: "unmapped", entities: 1, by_type: { LINE: 1 }, proposed_role: "channel" },
      { name: "FLOW", role: "unmapped", entities: 2, by_type: { LINE: 2 }, proposed_role: "channel" },
      { name: "PORTS", role: "unmapped", entities: 4, by_type: { CIRCLE: 4 }, proposed_role: "port" },
      { name: "TEXT", role: "unmapped", entities: 4, by_type: { TEXT: 4 }, proposed_role: "ignore" },
    ]);
  });

  it("names the mapped layers' roles and refuses invalid conditions", async () => {
    const mapped = await run(["layers", fixture("cross-r2000.dxf"), "--conditions", conditionsFile("map.json", { layers: { flow: { role: "channel" } } })]);
    expect((mapped.doc.layers as { name: string; role: string }[]).find((l) => l.name === "FLOW")!.role).toBe("channel");
    const bad = await run(["layers", fixture("cross-r2000.dxf"), "--conditions", conditionsFile("badmap.json", { layers: { FLOW: { role: "pipe" } } })]);
    expect(bad.code).toBe(2);
    expect(bad.doc).toMatchObject({ ok: false, error: { code: "invalid_conditions" } });
  });
});

describe("the installed command", () => {
  it("npm run -s stokeline: exit 0 with JSON, exit 2 with the error document and no stack trace", () => {
    const ok = execFileSync("npm", ["run", "-s", "stokeline", "--", "layers", fixture("straight-r2000.dxf")], { cwd: root, encoding: "utf8" });
    expect(JSON.parse(ok).ok).toBe(true);
    const empty = join(tmp, "empty.dxf");
    writeFileSync(empty, "");
    const bad = spawnSync("npm", ["run", "-s", "stokeline", "--", "analyze", empty], { cwd: root, encoding: "utf8" });
    expect(bad.status).toBe(2);
    expect(JSON.parse(bad.stdout)).toEqual({ ok: false, error: { code: "empty_file", message: expect.stringContaining("empty") } });
    expect(bad.stdout + bad.stderr).not.toMatch(/\n\s+at /);
  });
});
