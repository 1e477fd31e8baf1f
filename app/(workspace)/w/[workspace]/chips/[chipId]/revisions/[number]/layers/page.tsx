import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { revisionHref } from "@/components/chips/format";
import { LayerMapForm, type MappingLayer } from "@/components/chips/layer-map-form";
import { AccessDenied } from "@/components/ui/access-denied";
import { Notice } from "@/components/ui/notice";
import { PageHeader } from "@/components/ui/page-header";
import { getLatestLayerMapForChip, getLayerMap } from "@/db/queries/chips";
import { loadRevisionPage } from "@/lib/chips/page";
import { previewLayers, type LayoutPreview } from "@/lib/chips/preview";
import type { LayerMapInput } from "@/lib/chips/schemas";
import { readRevisionFile } from "@/lib/chips/service";
import type { LayerSummary } from "@/lib/network/types";
import { surveyLayout } from "@/lib/network/survey";

export const metadata: Metadata = { title: "Map layers" };

export default async function LayersPage({ params }: { params: Promise<{ workspace: string; chipId: string; number: string }> }) {
  const page = await loadRevisionPage(await params, "revision.upload", "/layers");
  if (!page.ok) return <AccessDenied message={page.message} homeHref={`/w/${page.slug}/chips`} />;
  const { access, slug, chip, revision, number } = page;
  const href = revisionHref(slug, chip.id, number);
  if (await getLayerMap(access.scope, revision.id)) redirect(href);

  const bytes = await readRevisionFile(revision.storageKey);
  const survey = surveyLayout(bytes);
  const remembered = (await getLatestLayerMapForChip(access.scope, chip.id)) as LayerMapInput | null;
  const rememberedByName = new Map(Object.entries(remembered?.layers ?? {}).map(([k, v]) => [k.toUpperCase(), v]));
  let preview: LayoutPreview | null = null;
  try {
    preview = previewLayers(bytes, remembered?.units ?? (survey.units ? undefined : "um"));
  } catch {
    preview = null; // the survey read it; a preview failure only loses the thumbnails
  }
  const layers: MappingLayer[] = (revision.layers as LayerSummary[]).map((l) => {
    const prev = rememberedByName.get(l.name.toUpperCase());
    const role = prev?.role ?? l.proposedRole ?? "ignore";
    return {
      name: l.name,
      entities: l.entities,
      byType: l.byType,
      style: l.style,
      role,
      depth: prev?.depth !== undefined ? String(prev.depth) : "",
      width: prev?.width !== undefined ? String(prev.width) : "",
      section: prev?.section ?? "",
      remembered: prev?.role === "channel" && prev.depth !== undefined,
    };
  });

  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <Link href={`/w/${slug}/chips/${chip.id}`}>{chip.name}</Link>{" "}
        <span aria-hidden="true">/</span> <Link href={href}>Revision {number}</Link> <span aria-hidden="true">/</span> <span className="text-ink-600">Layers</span>
      </nav>
      <PageHeader
        title={`Map the layers of revision ${number}`}
        lead="Step 2 of 3: tell Stokeline what each layer holds. Roles are proposed from the layer’s contents; check them."
      />
      {survey.warnings.length > 0 ? (
        <div className="mb-4">
          <Notice tone="warning" title="While reading the file">
            <ul className="list-disc pl-5">
              {survey.warnings.slice(0, 6).map((w) => (
                <li key={w.code + w.message}>{w.message}</li>
              ))}
            </ul>
          </Notice>
        </div>
      ) : null}
      <LayerMapForm
        chipId={chip.id}
        revisionNumber={number}
        revisionHref={href}
        initialLayers={layers}
        preview={preview}
        fileUnits={survey.units?.drawing ?? null}
        unitsProblem={survey.unitsProblem}
        rememberedUnits={remembered?.units ?? null}
      />
    </>
  );
}
