import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { AnalysisWorkbench, type CompareTarget, type PressureLimits } from "@/components/analysis";
import { analysisHref, formatWhen, revisionHref } from "@/components/chips/format";
import { ReviewStateBadge } from "@/components/chips/review-state";
import { AccessDenied } from "@/components/ui/access-denied";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getAnalysis, getLatestAnalysisIdForRevision, getRevisionById, getUserUnitPreferences, listAnalyses } from "@/db/queries/chips";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import type { Conditions } from "@/lib/analysis/conditions";
import { unitPreferencesSchema } from "@/lib/analysis/unit-preferences";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { loadRevisionPage, requireIdSegment } from "@/lib/chips/page";
import { adviceForFailure } from "@/lib/chips/service";
import { PROCESS_PROFILES } from "@/lib/rules";
import { parseQuantity } from "@/lib/units/quantity";
import { saveUnitPreferencesAction } from "../../../../../actions";

export const metadata: Metadata = { title: "Analysis" };

/** The pump's and the process's pressure limits this analysis was judged against (its stored conditions). */
function limitsOf(conditions: Conditions): PressureLimits {
  const limits: PressureLimits = {};
  try {
    if (conditions.pump?.max_pressure !== undefined) limits.pumpMaxPa = parseQuantity(conditions.pump.max_pressure, "pressure", "pump limit");
  } catch {
    // stored conditions were validated when analysed; an unreadable limit is simply not drawn
  }
  const process = conditions.process ? PROCESS_PROFILES[conditions.process] : undefined;
  if (process) {
    limits.processMaxPa = conditions.thresholds?.pressure_bond ?? process.maxWorkingPressurePa;
    limits.processName = process.label;
  }
  return limits;
}

export default async function AnalysisPage({
  params,
  searchParams,
}: {
  params: Promise<{ workspace: string; chipId: string; number: string; analysisId: string }>;
  searchParams: Promise<{ compare?: string }>;
}) {
  const route = await params;
  const { compare } = await searchParams;
  const page = await loadRevisionPage(route, "chip.view", `/analyses/${route.analysisId}`);
  if (!page.ok) return <AccessDenied message={page.message} />;
  const { access, slug, chip, revision, number } = page;
  const analysis = await getAnalysis(access.scope, requireIdSegment(route.analysisId));
  if (!analysis || analysis.revisionId !== revision.id) notFound();
  const here = analysisHref(slug, chip.id, number, analysis.id);

  const header = (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <Link href={revisionHref(slug, chip.id, number)}>Revision {number}</Link> <span aria-hidden="true">/</span>{" "}
        <span className="text-ink-600">{analysis.operatingPointName}</span>
      </nav>
      <PageHeader
        title={`${chip.name} · rev ${number} · ${analysis.operatingPointName}`}
        lead={
          <span className="flex flex-wrap items-center gap-2 text-sm">
            <ReviewStateBadge state={revision.reviewState} /> Analysed {formatWhen(analysis.createdAt)}
            <Link href={`${revisionHref(slug, chip.id, number)}/review`} className="font-semibold">Review and sign-off</Link>
          </span>
        }
      />
    </>
  );

  if (analysis.status !== "ok" || !analysis.result) {
    return (
      <>
        {header}
        <div className="space-y-4" data-testid="analysis-failed">
          <Notice tone="error" title="This analysis could not be completed">
            <p>{analysis.errorMessage ?? "The engine stopped without a message."}</p>
            <p className="mt-2 font-medium">{adviceForFailure(analysis.errorCode)}</p>
          </Notice>
          <p className="text-sm text-ink-600">
            The revision and this operating point are kept as they were. <Link href={revisionHref(slug, chip.id, number)}>Back to revision {number}</Link> to add a
            corrected operating point.
          </p>
          <ul className="list-disc space-y-1 pl-5 text-sm text-ink-700">
            {MODEL_CAUTIONS.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
      </>
    );
  }

  const result = analysis.result as unknown as AnalyzeJson;
  const units = unitPreferencesSchema.safeParse(await getUserUnitPreferences(access.user.id));

  // Compare links: the other successful analyses of this revision, and the previous revision's latest.
  const siblings = (await listAnalyses(access.scope, revision.id)).filter((a) => a.id !== analysis.id && a.status === "ok");
  const compareLinks = siblings.map((a) => ({ label: `Operating point “${a.operatingPointName}” of revision ${number}`, href: `${here}?compare=${a.id}` }));
  const parent = revision.parentRevisionId ? await getRevisionById(access.scope, revision.parentRevisionId) : null;
  if (parent) {
    const previous = await getLatestAnalysisIdForRevision(access.scope, parent.id);
    if (previous !== null) {
      const p = await getAnalysis(access.scope, previous);
      compareLinks.unshift({ label: `Revision ${parent.number} (“${p?.operatingPointName ?? "latest"}”)`, href: `${here}?compare=${previous}` });
    }
  }

  let compareTarget: CompareTarget | null = null;
  let compareProblem: string | null = null;
  if (compare) {
    const other = Number.isInteger(Number(compare)) ? await getAnalysis(access.scope, Number(compare)) : null;
    const otherRevision = other ? await getRevisionById(access.scope, other.revisionId) : null;
    if (!other || !otherRevision || otherRevision.chipId !== chip.id) compareProblem = "That analysis is not one of this chip’s; pick a comparison from the list.";
    else if (other.status !== "ok" || !other.result) compareProblem = "That analysis failed, so there is nothing to compare with.";
    else
      compareTarget = {
        analysis: other.result as unknown as AnalyzeJson,
        labels: { chip: chip.name, revision: `Revision ${otherRevision.number}`, operatingPoint: other.operatingPointName },
      };
  }

  return (
    <>
      {header}
      {compareProblem ? (
        <div className="mb-4">
          <Notice tone="warning">{compareProblem}</Notice>
        </div>
      ) : null}
      <AnalysisWorkbench
        analysis={result}
        labels={{ chip: chip.name, revision: `Revision ${number}`, operatingPoint: analysis.operatingPointName }}
        units={units.success ? units.data : undefined}
        limits={limitsOf(analysis.conditions as Conditions)}
        compare={compareTarget}
        compareLinks={compareLinks}
        closeCompareHref={compareTarget ? here : undefined}
        saveUnitsAction={saveUnitPreferencesAction}
        exportName={`${chip.name}-rev${number}-${analysis.operatingPointName}`.replace(/[^A-Za-z0-9._-]+/g, "_")}
      />
    </>
  );
}
