import type { Metadata } from "next";
import Link from "next/link";
import { analysisHref, formatBytes, formatWhen, revisionHref, shortSha } from "@/components/chips/format";
import { OperatingPointForm, type Choice } from "@/components/chips/operating-point-form";
import { ReviewStateBadge } from "@/components/chips/review-state";
import { SeverityBadge } from "@/components/chips/severity-badge";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getLatestOperatingPointForm, getLayerMap, listAnalyses } from "@/db/queries/chips";
import { loadRevisionPage } from "@/lib/chips/page";
import { can } from "@/lib/auth/permissions";
import { fluidChoiceValue } from "@/lib/chips/conditions";
import type { LayerMapInput, OperatingPointForm as FormValues } from "@/lib/chips/schemas";
import { listRevisionPorts } from "@/lib/chips/service";
import { listWorkspaceFluidChoices } from "@/lib/chips/settings";
import { DomainError } from "@/lib/errors";
import { listFluidPresets, SOLUTE_PRESETS } from "@/lib/hydraulics/fluids";
import { listProcesses } from "@/lib/rules";

export const metadata: Metadata = { title: "Revision" };

/** The form's starting values: the chip's last form where its ports still exist, else a plain pressure-driven start. */
function defaultsFor(ports: string[], last: Partial<FormValues> | null): FormValues {
  const lastPorts = new Map((last?.ports ?? []).map((p) => [p.name, p]));
  return {
    name: last?.name ? `${last.name}` : "nominal",
    fluid: last?.fluid ?? fluidChoiceValue("preset", "water"),
    temperature: last?.temperature ?? "25 degC",
    secondPhase: last?.secondPhase ?? "",
    interfacialTension: last?.interfacialTension ?? "",
    solute: last?.solute ?? "",
    process: last?.process ?? "pdms_soft_lithography",
    pumpMaxPressure: last?.pumpMaxPressure ?? "",
    cells: last?.cells ?? false,
    ports: ports.map((name, i) => lastPorts.get(name) ?? { name, drive: "pressure" as const, value: i === 0 ? "100 mbar" : "0 mbar" }),
  };
}

export default async function RevisionPage({
  params,
  searchParams,
}: {
  params: Promise<{ workspace: string; chipId: string; number: string }>;
  searchParams: Promise<{ mapped?: string }>;
}) {
  const page = await loadRevisionPage(await params, "chip.view");
  const { mapped: justMapped } = await searchParams;
  if (!page.ok) return <AccessDenied message={page.message} />;
  const { access, slug, chip, revision, number } = page;
  const href = revisionHref(slug, chip.id, number);
  const mapping = (await getLayerMap(access.scope, revision.id)) as LayerMapInput | null;
  const analyses = await listAnalyses(access.scope, revision.id);
  const frozen = revision.reviewState === "cleared" || revision.reviewState === "withdrawn";
  const mayAdd = can(access.scope, "operating_point.create") && !frozen;

  let formBlock: React.ReactNode = null;
  if (mayAdd && mapping) {
    let ports: string[] = [];
    let portsProblem: string | null = null;
    try {
      ports = await listRevisionPorts(access, revision.id, revision.storageKey, mapping);
    } catch (err) {
      if (!(err instanceof DomainError)) throw err;
      portsProblem = err.message;
    }
    const workspaceFluids = await listWorkspaceFluidChoices(access.scope);
    const last = (await getLatestOperatingPointForm(access.scope, chip.id)) as Partial<FormValues> | null;
    const library: Choice[] = listFluidPresets().map((f) => ({ value: fluidChoiceValue("preset", f.name), label: f.label }));
    const workspace: Choice[] = workspaceFluids.map((f) => ({ value: fluidChoiceValue("workspace", f.key), label: f.name }));
    const solutes: Choice[] = Object.entries(SOLUTE_PRESETS).map(([k, s]) => ({ value: k, label: s.label }));
    const processes: Choice[] = listProcesses().map((p) => ({ value: p.id, label: p.label }));
    formBlock =
      portsProblem || ports.length === 0 ? (
        <Notice tone="warning" title="No ports to drive">
          {portsProblem ?? "The port layer of this revision holds no port circles, so the channels cannot be driven. Add port circles to the layout and upload it again."}
        </Notice>
      ) : (
        <OperatingPointForm
          chipId={chip.id}
          revisionNumber={number}
          analysisBaseHref={`${href}/analyses`}
          defaults={defaultsFor(ports, last)}
          fluids={{ library, workspace }}
          solutes={solutes}
          processes={processes}
        />
      );
  }

  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <span className="text-ink-600">Revision {number}</span>
      </nav>
      <PageHeader
        title={`${chip.name} · revision ${number}`}
        lead={
          <span className="flex flex-wrap items-center gap-2">
            <ReviewStateBadge state={revision.reviewState} />
            <span className="font-mono text-sm">
              {revision.fileName} · {formatBytes(revision.sizeBytes)} · SHA-256 {shortSha(revision.sha256)}…
            </span>
            <span className="text-sm">uploaded {formatWhen(revision.uploadedAt)}</span>
            <Link href={`${href}/review`} className="text-sm font-semibold" data-testid="open-review">Review and sign-off</Link>
            <Link href={`${href}/brief`} className="text-sm font-semibold">Brief</Link>
            <Link href={`${href}/history`} className="text-sm font-semibold">History</Link>
          </span>
        }
        actions={
          <a className="btn-quiet" href={`/api/v1/chips/${chip.id}/revisions/${number}/file`}>
            Download DXF
          </a>
        }
      />
      {revision.note ? <blockquote className="mb-6 border-l-4 border-stream-300 bg-stream-50 px-3 py-2 text-sm text-ink-800">{revision.note}</blockquote> : null}
      {justMapped ? (
        <div className="mb-4">
          <Notice tone="success">Layers mapped. Step 3 of 3: set an operating point and Stokeline analyses it.</Notice>
        </div>
      ) : null}

      <section aria-labelledby="analyses-heading" className="mb-8">
        <h2 id="analyses-heading" className="mb-3 text-lg font-semibold text-ink-900">
          Analyses
        </h2>
        {analyses.length === 0 ? (
          <p className="text-sm text-ink-600">None yet.</p>
        ) : (
          <ul className="panel divide-y divide-ink-100" data-testid="analysis-list">
            {analyses.map((a) => (
              <li key={a.id} className="flex flex-wrap items-center gap-3 px-4 py-3 text-sm">
                <Link href={analysisHref(slug, chip.id, number, a.id)} className="font-semibold">
                  {a.operatingPointName}
                </Link>
                {a.status === "ok" ? (
                  <SeverityBadge severity={a.worstSeverity} count={(a.flagsBlock ?? 0) + (a.flagsWarn ?? 0) + (a.flagsInfo ?? 0)} />
                ) : (
                  <span className="rounded border border-halt-600 bg-halt-100 px-2 py-0.5 text-xs font-semibold text-halt-800">Analysis failed</span>
                )}
                <span className="text-ink-500">
                  {a.createdByName ?? "—"} · {formatWhen(a.createdAt)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="op-heading">
        <h2 id="op-heading" className="mb-3 text-lg font-semibold text-ink-900">
          New operating point
        </h2>
        {!mapping ? (
          can(access.scope, "revision.upload") && !frozen ? (
            <EmptyState title="Map the layers first" action={<Link className="btn-primary" href={`${href}/layers`}>Map the layers</Link>}>
              <p>Before an analysis Stokeline needs to know which layers hold channels and ports, and how deep the channels are.</p>
            </EmptyState>
          ) : (
            <p className="text-sm text-ink-600">The layers of this revision have not been mapped yet.</p>
          )
        ) : frozen ? (
          <Notice tone="info" title="Frozen">
            This revision is {revision.reviewState === "cleared" ? "cleared for tape-out" : "withdrawn"}; its analyses stay as they are. Upload a new revision to
            analyse a changed layout.
          </Notice>
        ) : mayAdd ? (
          formBlock
        ) : (
          <p className="text-sm text-ink-600">Device designers add operating points; you can open the analyses above.</p>
        )}
      </section>
    </>
  );
}
