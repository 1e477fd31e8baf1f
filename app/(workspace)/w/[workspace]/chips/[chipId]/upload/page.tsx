import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { UploadForm } from "@/components/chips/upload-form";
import { AccessDenied } from "@/components/ui/access-denied";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getChip } from "@/db/queries/chips";
import { getPageAccess } from "@/lib/auth/page";
import { maxUploadBytes } from "@/lib/chips/service";

export const metadata: Metadata = { title: "Upload a revision" };

export default async function UploadPage({
  params,
  searchParams,
}: {
  params: Promise<{ workspace: string; chipId: string }>;
  searchParams: Promise<{ first?: string }>;
}) {
  const { workspace: slug, chipId: rawId } = await params;
  const { first } = await searchParams;
  const access = await getPageAccess(slug, "revision.upload", `/w/${slug}/chips/${rawId}/upload`);
  if (!access.ok) return <AccessDenied message={access.message} homeHref={`/w/${slug}/chips`} />;
  const chipId = Number(rawId);
  if (!Number.isInteger(chipId) || chipId <= 0) notFound();
  const chip = await getChip(access.scope, chipId);
  if (!chip) notFound();
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <span className="text-ink-600">Upload</span>
      </nav>
      <PageHeader title={`Upload a revision of ${chip.name}`} lead="Step 1 of 3: the layout file. Next you map its layers, then set an operating point." />
      {first ? (
        <div className="mb-4">
          <Notice tone="success">Chip created. Upload its first layout to start the history.</Notice>
        </div>
      ) : null}
      <UploadForm slug={slug} workspaceId={access.workspace.id} chipId={chip.id} chipName={chip.name} maxBytes={maxUploadBytes()} />
    </>
  );
}
