import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { ReviewStateBadge } from "@/components/chips/review-state";
import { TrendCharts } from "@/components/portfolio/trend-charts";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getPageAccess } from "@/lib/auth/page";
import { NotFoundError } from "@/lib/errors";
import { formatArea, formatPressure } from "@/lib/reports/figures";
import { loadTrend } from "@/lib/reports/load";

export const metadata: Metadata = { title: "Trends" };

export default async function TrendsPage({ params }: { params: Promise<{ workspace: string; chipId: string }> }) {
  const { workspace: slug, chipId: rawId } = await params;
  const access = await getPageAccess(slug, "portfolio.view", `/w/${slug}/chips/${rawId}/trends`);
  if (!access.ok) return <AccessDenied message={access.message} />;
  const chipId = Number(rawId);
  if (!Number.isInteger(chipId) || chipId <= 0) notFound();
  let trend;
  try {
    trend = await loadTrend(access.scope, chipId);
  } catch (err) {
    if (err instanceof NotFoundError) notFound();
    throw err;
  }
  const { chip, points } = trend;
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/portfolio`}>Portfolio</Link> <span aria-hidden="true">/</span> <span className="text-ink-600">{chip.name}</span>
      </nav>
      <PageHeader
        title={`${chip.name}: trends`}
        lead={chip.purpose || "How the chip's figures moved across its revisions."}
        actions={
          <Link className="btn-quiet" href={`/w/${slug}/chips/${chip.id}`}>
            Open the chip
          </Link>
        }
      />
      {points.length === 0 ? (
        <EmptyState title="No revision yet">
          <p>Trends appear once a designer has uploaded and analysed a revision.</p>
        </EmptyState>
      ) : (
        <>
          <TrendCharts points={points} />
          <h2 className="mb-2 mt-8 text-lg font-semibold text-ink-900">Revision by revision</h2>
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="trend-table">
              <thead>
                <tr className="border-b border-ink-200 text-left text-ink-600">
                  <th className="py-1.5 pr-3 font-medium">Revision</th>
                  <th className="py-1.5 pr-3 font-medium">State</th>
                  <th className="py-1.5 pr-3 font-medium">Operating point</th>
                  <th className="py-1.5 pr-3 font-medium">Required pressure</th>
                  <th className="py-1.5 pr-3 font-medium">Flags (must change / check / note)</th>
                  <th className="py-1.5 pr-3 font-medium">Still open</th>
                  <th className="py-1.5 pr-3 font-medium">Footprint</th>
                  <th className="py-1.5 font-medium" />
                </tr>
              </thead>
              <tbody>
                {points.map((p) => (
                  <tr key={p.revisionId} className="border-b border-ink-100">
                    <td className="py-1.5 pr-3">{p.revisionNumber}</td>
                    <td className="py-1.5 pr-3">
                      <ReviewStateBadge state={p.state} />
                    </td>
                    <td className="py-1.5 pr-3">{p.operatingPointName ?? "Not analysed"}</td>
                    <td className="py-1.5 pr-3">{formatPressure(p.requiredPressurePa)}</td>
                    <td className="py-1.5 pr-3">
                      {p.flagsBlock} / {p.flagsWarn} / {p.flagsInfo}
                    </td>
                    <td className="py-1.5 pr-3">{p.analysisId === null ? "—" : p.openFlags}</td>
                    <td className="py-1.5 pr-3">{formatArea(p.footprintM2)}</td>
                    <td className="py-1.5">
                      <Link href={`/w/${slug}/chips/${chip.id}/revisions/${p.revisionNumber}/brief`}>Brief</Link>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </>
  );
}
