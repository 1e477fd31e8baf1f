import type { Metadata } from "next";
import Link from "next/link";
import { BriefView } from "@/components/brief/brief-view";
import { PrintButton } from "@/components/brief/print-button";
import { ShareLinksPanel } from "@/components/brief/share-links-panel";
import { AccessDenied } from "@/components/ui/access-denied";
import { loadRevisionPage } from "@/lib/chips/page";
import { can } from "@/lib/auth/permissions";
import { loadBrief } from "@/lib/reports/load";
import { DEFAULT_SHARE_DAYS, listRevisionShareLinks, MAX_SHARE_DAYS } from "@/lib/reports/share";

export const metadata: Metadata = { title: "Brief" };

export default async function BriefPage({ params }: { params: Promise<{ workspace: string; chipId: string; number: string }> }) {
  const page = await loadRevisionPage(await params, "report.view", "/brief");
  if (!page.ok) return <AccessDenied message={page.message} />;
  const { access, slug, chip, revision } = page;
  const brief = await loadBrief(access.scope, access.workspace.name, revision.id);
  const canShare = can(access.scope, "report.share");
  const links = canShare ? await listRevisionShareLinks(access, revision.id) : [];
  return (
    <>
      <nav aria-label="Breadcrumb" className="no-print mb-4 text-sm">
        <Link href={`/w/${slug}/portfolio`}>Portfolio</Link> <span aria-hidden="true">/</span>{" "}
        <Link href={`/w/${slug}/chips/${chip.id}/trends`}>{chip.name}</Link> <span aria-hidden="true">/</span>{" "}
        <span className="text-ink-600">Brief, revision {revision.number}</span>
      </nav>
      <div className="no-print mb-6 flex flex-wrap items-center gap-3">
        <a className="btn-primary" href={`/api/v1/revisions/${revision.id}/brief.pdf`} download data-testid="download-brief">
          Download PDF
        </a>
        <PrintButton />
        <Link className="btn-quiet" href={`/w/${slug}/chips/${chip.id}/revisions/${revision.number}`}>
          Open the revision
        </Link>
      </div>
      <BriefView brief={brief} />
      {canShare ? (
        <div className="mx-auto mt-10 max-w-4xl">
          <ShareLinksPanel revisionId={revision.id} initial={links} maxDays={MAX_SHARE_DAYS} defaultDays={DEFAULT_SHARE_DAYS} />
        </div>
      ) : null}
    </>
  );
}
