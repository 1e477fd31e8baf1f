import "server-only";
/** The brief as an HTTP response, shared by the member download and the share link. */
import { briefFileName } from "./load";
import type { BriefModel } from "./brief";
import { renderBriefPdf } from "./pdf";

/** A PDF response with a download name; `inline` opens it in the browser instead of saving. */
export async function briefPdfResponse(brief: BriefModel, disposition: "attachment" | "inline" = "attachment"): Promise<Response> {
  const bytes = await renderBriefPdf(brief);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/pdf",
      "content-disposition": `${disposition}; filename="${briefFileName(brief.chip.name, brief.revision.number)}"`,
      "cache-control": "private, no-store",
      "x-content-type-options": "nosniff",
    },
  });
}
