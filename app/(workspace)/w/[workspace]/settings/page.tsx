import type { Metadata } from "next";
import { headers } from "next/headers";
import { ApiTokens } from "@/components/settings/api-tokens";
import { FluidForm } from "@/components/settings/fluid-form";
import { ProcessLimitsForm, ThresholdForm } from "@/components/settings/override-forms";
import { AccessDenied } from "@/components/ui/access-denied";
import { PageHeader } from "@/components/ui/page-header";
import { listChips } from "@/db/queries/chips";
import { getPageAccess } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { PROCESS_LIMIT_FIELDS } from "@/lib/chips/conditions";
import { listProcessOverrides, listThresholdOverrides, listWorkspaceFluids } from "@/lib/chips/settings";
import { DEFAULT_TEMPERATURE_K, FLUID_PRESETS, listFluidPresets } from "@/lib/hydraulics/fluids";
import { listProcesses, RULES, type ProcessProfile } from "@/lib/rules";
import { saveFluidAction, saveProcessAction, saveThresholdAction } from "./actions";

export const metadata: Metadata = { title: "Settings" };

const SOURCE_KEY: Record<(typeof PROCESS_LIMIT_FIELDS)[number]["key"], keyof ProcessProfile["sources"]> = {
  maxWorkingPressurePa: "maxWorkingPressure",
  minFeatureM: "minFeature",
  minSpacingM: "minSpacing",
  minAspect: "minAspect",
  maxAspect: "maxAspect",
  maxWallAspect: "maxWallAspect",
  edgeMarginM: "edgeMargin",
};

/** A profile's default for a limit field, in SI (per-mask values at the profile's default mask). */
function profileValue(p: ProcessProfile, key: (typeof PROCESS_LIMIT_FIELDS)[number]["key"]): number | null {
  if (key === "minFeatureM") return p.minFeatureM[p.defaultMask];
  if (key === "minSpacingM") return p.minSpacingM[p.defaultMask];
  return p[key];
}

const fmt = (n: number, digits = 3) => Number(n.toPrecision(digits)).toString();
/** A quantity as typed ("1.3 mPa*s", "1620 kg/m^3") in print form ("1.3 mPa·s", "1620 kg/m³"). */
const pretty = (q: string) => q.replace(/\*/g, "·").replace(/\^3/g, "³").replace(/\^2/g, "²").replace(/\bum\b/g, "µm");

function SectionHeading({ id, title, children }: { id: string; title: string; children: React.ReactNode }) {
  return (
    <div className="mb-3">
      <h2 id={id} className="text-lg font-semibold text-ink-900">
        {title}
      </h2>
      <p className="max-w-3xl text-sm text-ink-600">{children}</p>
    </div>
  );
}

export default async function SettingsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "settings.view", `/w/${slug}/settings`);
  if (!access.ok) return <AccessDenied message={access.message} />;
  const { scope, workspace } = access;
  const [fluids, thresholds, processOverrides, chips] = await Promise.all([
    listWorkspaceFluids(scope),
    listThresholdOverrides(scope),
    listProcessOverrides(scope),
    listChips(scope),
  ]);
  const h = await headers();
  const origin = `${h.get("x-forwarded-proto") ?? "http"}://${h.get("host") ?? "localhost:3000"}`;
  const mayFluids = can(scope, "settings.fluids.edit");
  const mayProcess = can(scope, "settings.process.edit");
  const mayThresholds = can(scope, "settings.thresholds.edit");
  const th = "px-3 py-2 font-semibold";
  const td = "px-3 py-2 align-top";

  return (
    <>
      <PageHeader title="Settings" lead={`What ${workspace.name}’s analyses are judged with: fluids, fab process limits and flag thresholds; and your API tokens.`} />
      <nav aria-label="Settings sections" className="mb-8 flex flex-wrap gap-3 text-sm">
        <a href="#fluids">Fluids</a>
        <a href="#processes">Process profiles</a>
        <a href="#thresholds">Flag thresholds</a>
        <a href="#tokens">API tokens</a>
      </nav>

      <section aria-labelledby="fluids" className="mb-12">
        <SectionHeading id="fluids" title="Fluids">
          Built-in fluids follow the temperature of each operating point; values below are at 25 °C. Workspace fluids carry fixed values with the source of
          each. {mayFluids ? "" : "Designers and admins add and edit workspace fluids."}
        </SectionHeading>
        <div className="panel mb-4 overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="preset-fluids">
            <caption className="sr-only">Built-in fluids</caption>
            <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
              <tr>
                <th className={th}>Fluid</th>
                <th className={th}>Viscosity</th>
                <th className={th}>Density</th>
                <th className={th}>Surface tension</th>
                <th className={th}>Sources</th>
              </tr>
            </thead>
            <tbody>
              {listFluidPresets().map((f) => {
                const at = FLUID_PRESETS[f.name].at(DEFAULT_TEMPERATURE_K);
                return (
                  <tr key={f.name} className="border-b border-ink-100 last:border-0">
                    <td className={td}>
                      <span className="font-medium text-ink-900">{f.label}</span>
                      <br />
                      <span className="text-xs text-ink-600">{f.description}</span>
                    </td>
                    <td className={`${td} whitespace-nowrap`}>{fmt(at.viscosityPaS * 1e3)} mPa·s</td>
                    <td className={`${td} whitespace-nowrap`}>{fmt(at.densityKgPerM3, 4)} kg/m³</td>
                    <td className={`${td} whitespace-nowrap`}>{fmt(at.surfaceTensionNPerM * 1e3)} mN/m</td>
                    <td className={`${td} text-xs text-ink-600`}>
                      <ul className="space-y-0.5">
                        {Object.entries(f.sources).map(([k, s]) => (
                          <li key={k}>
                            <span className="font-medium">{k.replace("_", " ")}:</span> {s}
                          </li>
                        ))}
                      </ul>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
        <h3 className="mb-2 text-base font-semibold text-ink-900">Workspace fluids</h3>
        {fluids.length === 0 ? (
          <p className="mb-4 text-sm text-ink-600">None yet.</p>
        ) : (
          <div className="panel mb-4 overflow-x-auto">
            <table className="w-full text-left text-sm" data-testid="workspace-fluids">
              <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
                <tr>
                  <th className={th}>Fluid</th>
                  <th className={th}>Viscosity</th>
                  <th className={th}>Density</th>
                  <th className={th}>Surface tension</th>
                </tr>
              </thead>
              <tbody>
                {fluids.map((f) => (
                  <tr key={f.key} className="border-b border-ink-100 last:border-0">
                    <td className={td}>
                      <span className="font-medium">{f.name}</span> <span className="font-mono text-xs text-ink-500">{f.key}</span>
                    </td>
                    <td className={td}>
                      {pretty(f.viscosity)}
                      <br />
                      <span className="text-xs text-ink-600">{f.sources.viscosity}</span>
                    </td>
                    <td className={td}>
                      {pretty(f.density)}
                      <br />
                      <span className="text-xs text-ink-600">{f.sources.density}</span>
                    </td>
                    <td className={td}>
                      {pretty(f.surfaceTension)}
                      <br />
                      <span className="text-xs text-ink-600">{f.sources.surfaceTension}</span>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {mayFluids ? (
          <FluidForm
            slug={slug}
            action={saveFluidAction}
            fluids={fluids.map((f) => ({
              key: f.key,
              name: f.name,
              viscosity: f.viscosity,
              viscositySource: f.sources.viscosity,
              density: f.density,
              densitySource: f.sources.density,
              surfaceTension: f.surfaceTension,
              surfaceTensionSource: f.sources.surfaceTension,
            }))}
          />
        ) : null}
      </section>

      <section aria-labelledby="processes" className="mb-12">
        <SectionHeading id="processes" title="Process profiles">
          The fab rules and limits each layout is checked against. Published defaults with their sources; {mayProcess ? "as fab liaison you" : "fab liaisons"} can
          set your fab’s own measured limits, which new analyses then use. Defer to your fab’s design rules where they differ.
        </SectionHeading>
        <div className="space-y-4">
          {listProcesses().map((p) => {
            const o = processOverrides[p.id];
            return (
              <article key={p.id} className="panel p-4" data-testid="process-profile" data-process={p.id}>
                <h3 className="font-semibold text-ink-900">{p.label}</h3>
                <p className="text-sm text-ink-600">
                  {p.description} Cross-section: {p.section.replace("_", " ")}; default mask: {p.defaultMask}.
                </p>
                <table className="mt-3 w-full text-left text-sm">
                  <thead className="text-xs uppercase tracking-wide text-ink-600">
                    <tr>
                      <th className="py-1 pr-3">Limit</th>
                      <th className="py-1 pr-3">Default</th>
                      <th className="py-1 pr-3">This workspace</th>
                      <th className="py-1">Source</th>
                    </tr>
                  </thead>
                  <tbody>
                    {PROCESS_LIMIT_FIELDS.map((f) => {
                      const v = profileValue(p, f.key);
                      const ov = o?.values[f.key];
                      return (
                        <tr key={f.key} className="border-t border-ink-100 align-top">
                          <td className="py-1.5 pr-3">{f.label}</td>
                          <td className="whitespace-nowrap py-1.5 pr-3">{v === null ? "not limited" : `${fmt(v / f.toSi)} ${f.unit}`}</td>
                          <td className="whitespace-nowrap py-1.5 pr-3 font-medium">{ov !== undefined ? `${fmt(ov / f.toSi)} ${f.unit}` : "—"}</td>
                          <td className="py-1.5 text-xs text-ink-600">{p.sources[SOURCE_KEY[f.key]]}</td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
                {o?.note ? <p className="mt-2 text-sm text-ink-700">Workspace note: {o.note}</p> : null}
                {mayProcess ? (
                  <details className="mt-3">
                    <summary className="cursor-pointer text-sm font-semibold text-stream-700">Set your fab’s limits</summary>
                    <div className="mt-3">
                      <ProcessLimitsForm
                        action={saveProcessAction}
                        slug={slug}
                        processId={p.id}
                        label={p.label}
                        note={o?.note ?? ""}
                        fields={PROCESS_LIMIT_FIELDS.map((f) => ({
                          key: f.key,
                          label: f.label,
                          unit: f.unit,
                          current: o?.values[f.key] !== undefined ? fmt(o.values[f.key] / f.toSi) : "",
                        }))}
                      />
                    </div>
                  </details>
                ) : null}
              </article>
            );
          })}
        </div>
      </section>

      <section aria-labelledby="thresholds" className="mb-12">
        <SectionHeading id="thresholds" title="Flag thresholds">
          Every rule Stokeline applies, with its default threshold and source. {mayThresholds ? "As fluidics reviewer you" : "Fluidics reviewers"} can set a
          workspace threshold with a note saying why; new analyses use it, and existing ones keep what they ran with.
        </SectionHeading>
        <div className="panel overflow-x-auto">
          <table className="w-full text-left text-sm" data-testid="threshold-table">
            <thead className="border-b border-ink-200 bg-ink-50 text-xs uppercase tracking-wide text-ink-600">
              <tr>
                <th className={th}>Rule</th>
                <th className={th}>Default</th>
                <th className={th}>This workspace</th>
                <th className={th}>Source</th>
              </tr>
            </thead>
            <tbody>
              {RULES.map((r) => {
                const o = thresholds[r.code];
                return (
                  <tr key={r.code} className="border-b border-ink-100 last:border-0" data-rule={r.code}>
                    <td className={td}>
                      <span className="font-medium text-ink-900">{r.title}</span>
                      <br />
                      <span className="font-mono text-xs text-ink-500">{r.code}</span> <span className="text-xs text-ink-600">· {r.severity === "block" ? "must change" : r.severity === "warn" ? "check" : "note"}</span>
                    </td>
                    <td className={`${td} whitespace-nowrap`}>{r.defaultThreshold === null ? "from the process" : r.defaultThreshold <= 0 ? "—" : `${r.defaultThreshold} ${r.thresholdUnit}`}</td>
                    <td className={td}>
                      {r.defaultThreshold === null ? (
                        <span className="text-xs text-ink-500">Set under Process profiles</span>
                      ) : r.defaultThreshold <= 0 ? (
                        <span className="text-xs text-ink-500">Fixed: a matter of geometry, not a tunable limit</span>
                      ) : mayThresholds ? (
                        <ThresholdForm
                          action={saveThresholdAction}
                          slug={slug}
                          ruleCode={r.code}
                          title={r.title}
                          unit={r.thresholdUnit}
                          defaultThreshold={r.defaultThreshold}
                          current={o ? { value: o.value, note: o.note } : null}
                        />
                      ) : o ? (
                        <span>
                          <span className="font-medium">{o.value}</span> <span className="text-xs text-ink-600">{o.note}</span>
                        </span>
                      ) : (
                        "—"
                      )}
                    </td>
                    <td className={`${td} text-xs text-ink-600`}>{r.source}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </section>

      <section aria-labelledby="tokens">
        <SectionHeading id="tokens" title="Personal API tokens">
          For your own scripts: a token acts as you, with your current roles, until you revoke it. It is shown once when created.
        </SectionHeading>
        <ApiTokens workspaceId={workspace.id} origin={origin} exampleChipId={chips[0]?.id ?? null} />
      </section>
    </>
  );
}
