/**
 * Text of a PDF, page by page, read with pdfjs-dist's legacy (Node) build —
 * an independent reader of what pdfkit wrote. Also the page count and the
 * magic header check.
 */
export async function pdfText(bytes: Uint8Array): Promise<{ pages: string[]; all: string }> {
  const pdfjs = await import("pdfjs-dist/legacy/build/pdf.mjs");
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes), disableFontFace: true, useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const page = await doc.getPage(i);
    const content = await page.getTextContent();
    let text = "";
    for (const item of content.items) {
      if ("str" in item) text += item.str + (item.hasEOL ? "\n" : "");
    }
    pages.push(text);
  }
  await doc.destroy();
  return { pages, all: pages.join("\n") };
}

/** True when the bytes start with the PDF header "%PDF-" (ISO 32000-1 §7.5.2). */
export function looksLikePdf(bytes: Uint8Array): boolean {
  return Buffer.from(bytes.subarray(0, 5)).toString("latin1") === "%PDF-";
}
