import type { Metadata } from "next";
import { PortfolioCard } from "@/components/portfolio/portfolio-card";
import { PortfolioFilters } from "@/components/portfolio/portfolio-filters";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { getPageAccess } from "@/lib/auth/page";
import { filterPortfolio } from "@/lib/reports/figures";
import { loadPortfolio } from "@/lib/reports/load";

export const metadata: Metadata = { title: "Portfolio" };

type Search = { state?: string | string[]; q?: string | string[] };
const one = (v: string | string[] | undefined): string => (Array.isArray(v) ? (v[0] ?? "") : (v ?? "")).slice(0, 100);

export default async function PortfolioPage({ params, searchParams }: { params: Promise<{ workspace: string }>; searchParams: Promise<Search> }) {
  const { workspace: slug } = await params;
  const search = await searchParams;
  const access = await getPageAccess(slug, "portfolio.view", `/w/${slug}/portfolio`);
  if (!access.ok) return <AccessDenied message={access.message} />;
  const state = one(search.state);
  const query = one(search.q);
  const all = await loadPortfolio(access.scope);
  const cards = filterPortfolio(all, { state, query });
  const cleared = all.filter((c) => c.cleared).length;
  const withOpenBlocks = all.filter((c) => c.worstOpen?.severity === "block").length;
  return (
    <>
      <PageHeader
        title="Portfolio"
        lead={`${all.length} chip${all.length === 1 ? "" : "s"}: ${cleared} cleared for tape-out, ${withOpenBlocks} with a blocking flag still open. Figures are from each chip's newest revision.`}
      />
      <PortfolioFilters action={`/w/${slug}/portfolio`} state={state} query={query} />
      {all.length === 0 ? (
        <EmptyState title="No chips yet">
          <p>Chips appear here as soon as a device designer creates one and uploads its layout.</p>
        </EmptyState>
      ) : cards.length === 0 ? (
        <EmptyState title="No chip matches">
          <p>Nothing matches this search and state. Clear the filter to see every chip.</p>
        </EmptyState>
      ) : (
        <ul className="grid gap-4 lg:grid-cols-2" aria-label="Chips">
          {cards.map((c) => (
            <PortfolioCard key={c.chipId} card={c} slug={slug} />
          ))}
        </ul>
      )}
      <section aria-labelledby="portfolio-cautions" className="mt-10 rounded-md border-l-4 border-heed-600 bg-heed-100 px-4 py-3">
        <h2 id="portfolio-cautions" className="text-sm font-semibold text-heed-800">
          Before you rely on any figure
        </h2>
        <ul className="mt-1 list-disc space-y-1 pl-5 text-sm text-ink-800">
          {MODEL_CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
    </>
  );
}
