import type { Metadata } from "next";
import { ChipTable } from "@/components/chips/chip-table";
import { NewChipForm } from "@/components/chips/new-chip-form";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { listChips } from "@/db/queries/chips";
import { getPageAccess } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { chipListView } from "@/lib/chips/views";
import { createChipAction } from "./actions";

export const metadata: Metadata = { title: "Chips" };

export default async function ChipsPage({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "chip.view", `/w/${slug}/chips`);
  if (!access.ok) return <AccessDenied message={access.message} />;
  const { scope, workspace } = access;
  const rows = (await listChips(scope)).map(chipListView);
  const designer = can(scope, "chip.create");
  return (
    <>
      <PageHeader
        title="Chips"
        lead="Every device under development, its latest revision, where it stands in review and its worst flag."
        actions={designer && rows.length > 0 ? <NewChipForm slug={slug} action={createChipAction} /> : undefined}
      />
      {rows.length === 0 ? (
        designer ? (
          <EmptyState title="Create your first chip" action={<NewChipForm slug={slug} action={createChipAction} />}>
            <p>
              A chip is one device under development. Create it, upload its layout as a DXF, map the layers to channels and ports, and set an operating
              point: Stokeline solves the channel network and flags flow-regime and fabrication risks.
            </p>
          </EmptyState>
        ) : (
          <EmptyState title="No chips yet">
            <p>Nothing has been uploaded to {workspace.name} yet. Chips appear here as soon as a device designer creates one.</p>
          </EmptyState>
        )
      ) : (
        <ChipTable workspaceId={workspace.id} slug={slug} initialRows={rows} />
      )}
    </>
  );
}
