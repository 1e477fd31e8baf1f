import { DomainError } from "@/lib/errors";
import { briefPdfResponse } from "@/lib/reports/http";
import { loadBrief } from "@/lib/reports/load";
import { openShareLink } from "@/lib/reports/share";

function plainPage(status: number, title: string, message: string): Response {
  const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]!);
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)} · Stokeline</title><meta name="robots" content="noindex"></head><body style="font-family:system-ui,sans-serif;max-width:36rem;margin:4rem auto;padding:0 1rem;color:#1b2430"><h1 style="font-size:1.25rem">${esc(title)}</h1><p>${esc(message)}</p></body></html>`;
  return new Response(html, { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } });
}

/** GET /share/{token}/brief.pdf — the shared brief as PDF; 404 for an unknown link, 410 (Gone) when revoked or expired. */
export async function GET(_req: Request, ctx: { params: Promise<{ token: string }> }): Promise<Response> {
  const { token } = await ctx.params;
  try {
    const opened = await openShareLink(token, new Date(), "pdf");
    const brief = await loadBrief(opened.scope, opened.workspaceName, opened.revisionId);
    return await briefPdfResponse(brief);
  } catch (err) {
    if (err instanceof DomainError) return plainPage(err.status, err.status === 410 ? "This link no longer works" : "Nothing here", err.message);
    console.error(err);
    return plainPage(500, "Something went wrong", "The brief could not be generated. Try again later.");
  }
}
