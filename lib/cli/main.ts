/**
 * The `stokeline` command line.
 *   stokeline analyze LAYOUT.dxf [--conditions CONDITIONS.json] [--pretty]
 *   stokeline layers  LAYOUT.dxf [--conditions CONDITIONS.json] [--pretty]
 * Prints one JSON document on stdout. Exit 0 on success; 2 with
 * {"ok":false,"error":{code,message}} when the input is at fault (a
 * DomainError); 1 with code "internal" for anything else. Never a stack trace.
 */
import { readFileSync } from "node:fs";
import { pathToFileURL } from "node:url";
import { ConditionsError, DomainError } from "../errors";
import { geometryConditionsSchema } from "../analysis/conditions";
import type { LayerSummary } from "../network/types";

const USAGE =
  "Usage: stokeline analyze LAYOUT.dxf [--conditions CONDITIONS.json] [--pretty] | stokeline layers LAYOUT.dxf [--conditions CONDITIONS.json] [--pretty]";

interface Args {
  command: string;
  layout: string;
  conditions: string | null;
  pretty: boolean;
}

function parseArgs(argv: string[]): Args {
  const rest: string[] = [];
  let conditions: string | null = null;
  let pretty = false;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === "--conditions" || a === "-c") {
      const v = argv[++i];
      if (!v) throw new DomainError("usage", `--conditions needs a file name. ${USAGE}`);
      conditions = v;
    } else if (a.startsWith("--conditions=")) conditions = a.slice("--conditions=".length);
    else if (a === "--pretty") pretty = true;
    else if (a.startsWith("-")) throw new DomainError("usage", `Unknown option ${a}. ${USAGE}`);
    else rest.push(a);
  }
  const [command, layout, ...extra] = rest;
  if (!command || !["analyze", "layers"].includes(command)) throw new DomainError("usage", command ? `Unknown command "${command}". ${USAGE}` : USAGE);
  if (!layout) throw new DomainError("usage", `Name the layout file. ${USAGE}`);
  if (extra.length > 0) throw new DomainError("usage", `Unexpected argument "${extra[0]}". ${USAGE}`);
  return { command, layout, conditions, pretty };
}

function readInput(path: string, what: string): Buffer {
  try {
    return readFileSync(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === "ENOENT" ? "does not exist" : code === "EISDIR" ? "is a folder" : code === "EACCES" ? "cannot be read (permission denied)" : "cannot be read";
    throw new DomainError("file_unreadable", `The ${what} file "${path}" ${why}.`);
  }
}

function readConditions(path: string | null): unknown {
  if (path === null) return {};
  const text = readInput(path, "conditions").toString("utf8");
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new ConditionsError("invalid_conditions_json", `The conditions file "${path}" is not valid JSON (${(e as Error).message}).`);
  }
}

const layerJson = (l: LayerSummary) => ({
  name: l.name,
  role: l.role,
  entities: l.entities,
  by_type: l.byType,
  ...(l.style ? { style: l.style } : {}),
  ...(l.proposedRole ? { proposed_role: l.proposedRole } : {}),
});

/** Run one command; returns the exit code. `write` receives the single JSON document. */
export async function runCli(argv: string[], write: (text: string) => void): Promise<number> {
  let pretty = argv.includes("--pretty");
  const emit = (doc: unknown) => write(JSON.stringify(doc, null, pretty ? 2 : undefined) + "\n");
  try {
    const args = parseArgs(argv);
    pretty = args.pretty;
    const layout = readInput(args.layout, "layout");
    const rawConditions = readConditions(args.conditions);
    if (args.command === "layers") {
      const { surveyLayout } = await import("../network/survey");
      const parsed = geometryConditionsSchema.safeParse(rawConditions ?? {});
      if (!parsed.success) {
        const issues = parsed.error.issues.map((i) => `${i.path.join(".") || "conditions"}: ${i.message}`);
        throw new ConditionsError("invalid_conditions", `The conditions are not valid — ${issues.join("; ")}.`);
      }
      const conditions = parsed.data;
      const survey = surveyLayout(new Uint8Array(layout.buffer, layout.byteOffset, layout.byteLength), conditions);
      emit({
        ok: true,
        units: survey.units ? { drawing: survey.units.drawing, source: survey.units.source } : null,
        ...(survey.unitsProblem ? { units_problem: survey.unitsProblem } : {}),
        layers: survey.layers.map(layerJson),
        warnings: survey.warnings,
      });
      return 0;
    }
    // Loaded on demand: the analysis pipeline pulls in the hydraulics and rules.
    const { analyzeLayout } = await import("../analysis/analyze");
    emit(analyzeLayout(new Uint8Array(layout.buffer, layout.byteOffset, layout.byteLength), rawConditions));
    return 0;
  } catch (e) {
    if (e instanceof DomainError) {
      const details = e.details as { layers?: LayerSummary[] } | undefined;
      emit({ ok: false, error: { code: e.code, message: e.message, ...(Array.isArray(details?.layers) ? { layers: details.layers.map(layerJson) } : {}) } });
      return 2;
    }
    emit({ ok: false, error: { code: "internal", message: e instanceof Error ? e.message : String(e) } });
    return 1;
  }
}

const invokedDirectly = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (invokedDirectly) {
  runCli(process.argv.slice(2), (t) => process.stdout.write(t)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stdout.write(JSON.stringify({ ok: false, error: { code: "internal", message: e instanceof Error ? e.message : String(e) } }) + "\n");
      process.exitCode = 1;
    },
  );
}
