import "server-only";
/**
 * Renders a brief (lib/reports/brief.ts) to PDF with pdfkit, embedding the
 * app's own IBM Plex fonts (public/fonts, read by pdfkit's fontkit). A4
 * portrait; every page carries the revision's SHA-256 and the generation time
 * (UTC) in its footer. Only the sans faces are embedded: fontkit cannot lay
 * out the mono WOFF's colon between digits, nor subset its WOFF2 file.
 * The content comes only from the model, so the PDF and
 * the HTML view say the same thing.
 */
import path from "node:path";
import PDFDocument from "pdfkit";
import type { BriefDrawing, BriefModel } from "./brief";

type Doc = PDFKit.PDFDocument;

const FONT_DIR = path.join(process.cwd(), "public", "fonts");
const FONTS = {
  regular: path.join(FONT_DIR, "ibm-plex-sans-latin-400-normal.woff"),
  medium: path.join(FONT_DIR, "ibm-plex-sans-latin-500-normal.woff"),
  bold: path.join(FONT_DIR, "ibm-plex-sans-latin-600-normal.woff"),
} as const;

const INK = "#1b2430";
const MUTED = "#55606e";
const RULE = "#c9d1db";
const TONE = { over: "#b8321a", near: "#a86400", ok: "#0c6a5c", none: MUTED } as const;
const SEVERITY_COLOUR: Record<string, string> = { block: "#b8321a", warn: "#a86400", info: "#0b62b0", none: "#0c6a5c" };
const CAUTION_BORDER = "#a86400";
const CAUTION_FILL = "#fff4e0";

const MARGIN = { top: 54, bottom: 64, left: 48, right: 48 };

/** Characters outside the fonts' Latin subset, spelled with ones inside it. */
const SUBSTITUTES: Record<string, string> = {
  "→": "->",
  "←": "<-",
  "≤": "<=",
  "≥": ">=",
  "≈": "~",
  "≠": "!=",
  "Δ": "delta ",
  "√": "sqrt",
  "τ": "tau",
  "ū": "u",
  "ρ": "rho",
  "μ": "µ",
  "σ": "sigma",
  "‑": "-",
  "‒": "-",
  "∞": "inf",
  "↺": "",
  "▶": ">",
  "◀": "<",
};

/** True for code points the fontsource "latin" subset of IBM Plex covers (checked with fontkit on the shipped files). */
function inSubset(cp: number): boolean {
  return (
    (cp >= 0x20 && cp <= 0x7e) ||
    (cp >= 0xa0 && cp <= 0xff) ||
    (cp >= 0x2013 && cp <= 0x2014) ||
    (cp >= 0x2018 && cp <= 0x201e) ||
    cp === 0x2022 ||
    cp === 0x2026 ||
    cp === 0x2212 ||
    cp === 0x20ac ||
    cp === 0x2122 ||
    cp === 0x0152 ||
    cp === 0x0153
  );
}

/** Text made safe for the embedded fonts: known symbols spelled out, anything else outside the subset as "?". */
export function pdfSafeText(text: string): string {
  let out = "";
  for (const ch of text.replace(/\r\n?/g, "\n")) {
    if (ch === "\n" || ch === "\t") {
      out += ch === "\t" ? " " : ch;
      continue;
    }
    const sub = SUBSTITUTES[ch];
    if (sub !== undefined) out += sub;
    else if (ch === "\u2009" || ch === "\u202f" || ch === "\u00a0") out += " ";
    else out += inSubset(ch.codePointAt(0)!) ? ch : "?";
  }
  return out;
}

function contentWidth(doc: Doc): number {
  return doc.page.width - MARGIN.left - MARGIN.right;
}

function bottomLimit(doc: Doc): number {
  return doc.page.height - MARGIN.bottom;
}

/** Starts a new page when fewer than `height` points remain. */
function ensureSpace(doc: Doc, height: number): void {
  if (doc.y + height > bottomLimit(doc)) doc.addPage();
}

function heading(doc: Doc, text: string): void {
  ensureSpace(doc, 48);
  doc.moveDown(0.6);
  doc.font("bold").fontSize(13).fillColor(INK).text(pdfSafeText(text), MARGIN.left, doc.y, { width: contentWidth(doc) });
  const y = doc.y + 2;
  doc.moveTo(MARGIN.left, y).lineTo(MARGIN.left + contentWidth(doc), y).lineWidth(0.6).strokeColor(RULE).stroke();
  doc.y = y + 6;
}

function paragraph(doc: Doc, text: string, opts: { size?: number; colour?: string; font?: keyof typeof FONTS; indent?: number } = {}): void {
  const size = opts.size ?? 9.5;
  const x = MARGIN.left + (opts.indent ?? 0);
  const width = contentWidth(doc) - (opts.indent ?? 0);
  const safe = pdfSafeText(text);
  doc.font(opts.font ?? "regular").fontSize(size);
  ensureSpace(doc, Math.min(doc.heightOfString(safe, { width }), 200));
  doc.fillColor(opts.colour ?? INK).text(safe, x, doc.y, { width });
}

function titleBlock(doc: Doc, brief: BriefModel): void {
  doc.font("medium").fontSize(9).fillColor(MUTED).text(pdfSafeText(`STOKELINE BRIEF · ${brief.workspaceName}`), MARGIN.left, MARGIN.top, { width: contentWidth(doc), characterSpacing: 0.6 });
  doc.moveDown(0.3);
  doc.font("bold").fontSize(22).fillColor(INK).text(pdfSafeText(brief.title), { width: contentWidth(doc) });
  doc.font("medium").fontSize(12).fillColor(MUTED).text(pdfSafeText(brief.subtitle), { width: contentWidth(doc) });
  doc.moveDown(0.4);
  if (brief.chip.purpose) paragraph(doc, brief.chip.purpose, { size: 10.5 });
  doc.moveDown(0.4);
  const r = brief.revision;
  const rows: [string, string][] = [
    ["File", `${r.fileName}, uploaded ${r.uploadedAt} by ${r.uploaderName}`],
    ["SHA-256", r.sha256],
    ["Review state", `${r.stateLabel} since ${r.stateSince}`],
    ["Figures from", brief.analysis ? `Operating point “${brief.analysis.operatingPointName}” (analysis ${brief.analysis.id}, ${brief.analysis.createdAt}), ${brief.analysis.basis}` : "No successful analysis yet"],
  ];
  if (r.note) rows.push(["Designer's note", r.note]);
  labelledRows(doc, rows);
}

function labelledRows(doc: Doc, rows: [string, string][]): void {
  const labelW = 92;
  const valueW = contentWidth(doc) - labelW;
  for (const [label, value] of rows) {
    const safe = pdfSafeText(value);
    const font = label === "SHA-256" ? "regular" : "regular";
    doc.font(font).fontSize(9);
    const h = doc.heightOfString(safe, { width: valueW });
    ensureSpace(doc, h + 3);
    const y = doc.y;
    doc.font("medium").fontSize(9).fillColor(MUTED).text(pdfSafeText(label), MARGIN.left, y, { width: labelW - 6 });
    doc.font(font).fontSize(9).fillColor(INK).text(safe, MARGIN.left + labelW, y, { width: valueW });
    doc.y = Math.max(doc.y, y + h) + 3;
  }
}

function figuresTable(doc: Doc, brief: BriefModel): void {
  heading(doc, "Key figures and their limits");
  const w = contentWidth(doc);
  const cols = [0.27, 0.2, 0.53].map((f) => f * w);
  for (const f of brief.figures) {
    const detail = [f.limit ? `Limit: ${f.limit}.` : "", f.note].filter(Boolean).join(" ");
    doc.font("regular").fontSize(9);
    const h = Math.max(doc.heightOfString(pdfSafeText(detail), { width: cols[2] - 4 }), 12);
    ensureSpace(doc, h + 6);
    const y = doc.y;
    doc.font("medium").fontSize(9.5).fillColor(INK).text(pdfSafeText(f.label), MARGIN.left, y, { width: cols[0] - 6 });
    doc.font("bold").fontSize(10).fillColor(TONE[f.status]).text(pdfSafeText(f.value), MARGIN.left + cols[0], y, { width: cols[1] - 6 });
    if (f.status === "over" || f.status === "near") {
      doc.font("medium").fontSize(7.5).fillColor(TONE[f.status]).text(f.status === "over" ? "OVER LIMIT" : "NEAR LIMIT", MARGIN.left + cols[0], doc.y, { width: cols[1] - 6 });
    }
    const afterValue = doc.y;
    doc.font("regular").fontSize(9).fillColor(MUTED).text(pdfSafeText(detail), MARGIN.left + cols[0] + cols[1], y, { width: cols[2] - 4 });
    doc.y = Math.max(doc.y, afterValue, y + h) + 4;
    doc.moveTo(MARGIN.left, doc.y - 2).lineTo(MARGIN.left + w, doc.y - 2).lineWidth(0.3).strokeColor(RULE).stroke();
  }
}

function cautionsBox(doc: Doc, brief: BriefModel): void {
  const w = contentWidth(doc);
  const inner = w - 28;
  const title = "Read before relying on these figures";
  doc.font("regular").fontSize(9);
  const texts = brief.cautions.map((c) => pdfSafeText(c));
  const bodyH = texts.reduce((s, t) => s + doc.heightOfString(t, { width: inner - 10 }) + 4, 0);
  const h = bodyH + 34;
  doc.moveDown(0.8);
  ensureSpace(doc, h + 6);
  const x = MARGIN.left;
  const y = doc.y;
  doc.rect(x, y, w, h).fillColor(CAUTION_FILL).fill();
  doc.rect(x, y, 4, h).fillColor(CAUTION_BORDER).fill();
  doc.rect(x, y, w, h).lineWidth(0.8).strokeColor(CAUTION_BORDER).stroke();
  doc.font("bold").fontSize(11).fillColor("#6b3f00").text(title, x + 14, y + 9, { width: inner });
  let cy = doc.y + 4;
  for (const t of texts) {
    doc.font("regular").fontSize(9).fillColor(INK);
    doc.circle(x + 17, cy + 5, 1.6).fillColor("#6b3f00").fill();
    doc.fillColor(INK).text(t, x + 24, cy, { width: inner - 10 });
    cy = doc.y + 4;
  }
  doc.y = y + h + 4;
}

function drawingBlock(doc: Doc, drawing: BriefDrawing): void {
  const w = contentWidth(doc);
  // Up to 300 pt tall; shrunk (to no less than 120 pt) to stay on the current page when that is enough.
  const room = bottomLimit(doc) - doc.y - 100;
  const maxH = room >= 120 ? Math.min(300, room) : 300;
  const k = Math.min(w / drawing.box.width, maxH / drawing.box.height);
  const drawnW = drawing.box.width * k;
  const drawnH = drawing.box.height * k;
  ensureSpace(doc, drawnH + 100); // heading, drawing and legend stay together
  heading(doc, "The chip, coloured by pressure");
  const x0 = MARGIN.left + (w - drawnW) / 2;
  const y0 = doc.y + 4;
  const X = (x: number) => x0 + (x - drawing.box.minX) * k;
  const Y = (y: number) => y0 + (y - drawing.box.minY) * k;
  doc.save();
  doc.rect(MARGIN.left, y0 - 2, w, drawnH + 4).lineWidth(0.4).strokeColor(RULE).stroke();
  for (const ring of drawing.outline) {
    if (ring.length < 2) continue;
    doc.moveTo(X(ring[0][0]), Y(ring[0][1]));
    for (const p of ring.slice(1)) doc.lineTo(X(p[0]), Y(p[1]));
    doc.lineWidth(0.6).strokeColor("#8592a3").stroke();
  }
  doc.lineCap("round").lineJoin("round");
  for (const s of drawing.segments) {
    if (s.points.length === 0) continue;
    doc.moveTo(X(s.points[0][0]), Y(s.points[0][1]));
    if (s.points.length === 1) doc.lineTo(X(s.points[0][0]) + 0.01, Y(s.points[0][1]));
    for (const p of s.points.slice(1)) doc.lineTo(X(p[0]), Y(p[1]));
    doc.lineWidth(Math.max(s.widthUm * k, 0.7)).strokeColor(s.colour).stroke();
  }
  for (const p of drawing.ports) {
    const r = Math.max(p.radiusUm * k, 2.5);
    doc.circle(X(p.x), Y(p.y), r).lineWidth(0.8).strokeColor(INK).stroke();
    doc.font("medium").fontSize(7).fillColor(INK).text(pdfSafeText(p.name), X(p.x) + r + 1.5, Y(p.y) - 3.5, { lineBreak: false });
  }
  doc.restore();
  doc.y = y0 + drawnH + 10;
  legend(doc, drawing);
}

function legend(doc: Doc, drawing: BriefDrawing): void {
  const x = MARGIN.left;
  const barW = Math.min(260, contentWidth(doc));
  const y = doc.y;
  doc.font("medium").fontSize(8.5).fillColor(INK).text(pdfSafeText(drawing.legend.title), x, y, { width: contentWidth(doc) });
  if (drawing.legend.noData) return;
  const by = doc.y + 2;
  const grad = doc.linearGradient(x, 0, x + barW, 0);
  for (const s of drawing.legend.stops) grad.stop(s.offset, s.colour);
  doc.rect(x, by, barW, 9).fill(grad);
  doc.rect(x, by, barW, 9).lineWidth(0.4).strokeColor(MUTED).stroke();
  for (const t of drawing.legend.ticks) {
    const tx = x + t.offset * barW;
    doc.moveTo(tx, by + 9).lineTo(tx, by + 12).lineWidth(0.5).strokeColor(INK).stroke();
    doc.font("regular").fontSize(7.5).fillColor(INK).text(t.label, tx - 20, by + 13, { width: 40, align: "center", lineBreak: false });
  }
  doc.y = by + 24;
  doc.font("regular").fontSize(8).fillColor(MUTED).text("Viridis colour scale (lightness rises with pressure; reads in greyscale). Channels drawn at their mean width; circles are ports.", x, doc.y, { width: contentWidth(doc) });
}

function flagsBlock(doc: Doc, brief: BriefModel): void {
  heading(doc, `Flags and their dispositions (${brief.flags.length})`);
  if (brief.flags.length === 0) {
    paragraph(doc, brief.analysis ? "The analysis raised no flags." : "No analysis, so no flags yet.", { colour: MUTED });
    return;
  }
  for (const f of brief.flags) {
    const colour = SEVERITY_COLOUR[f.severity] ?? MUTED;
    const lines: { text: string; font: keyof typeof FONTS; size: number; colour: string }[] = [
      { text: `${f.severityLabel.toUpperCase()} · ${f.title} — ${f.where}${f.value ? ` · ${f.value}` : ""}`, font: "bold", size: 9.5, colour: INK },
    ];
    if (f.message) lines.push({ text: f.message, font: "regular", size: 8.5, colour: MUTED });
    lines.push({ text: `${f.standingLabel}${f.decidedBy ? ` — ${f.decidedBy}, ${f.decidedAt}` : ""}`, font: "medium", size: 9, colour: f.standing === "waived" || f.standing === "fixed" ? TONE.ok : colour });
    if (f.justification) lines.push({ text: `${f.standing === "waived" ? "Waiver justification" : "Reviewer's note"}: “${f.justification}”`, font: "regular", size: 9, colour: INK });
    const width = contentWidth(doc) - 12;
    const h = lines.reduce((s, l) => s + (doc.font(l.font).fontSize(l.size).heightOfString(pdfSafeText(l.text), { width }) + 1.5), 0);
    ensureSpace(doc, Math.min(h + 8, 260));
    const y = doc.y;
    for (const l of lines) doc.font(l.font).fontSize(l.size).fillColor(l.colour).text(pdfSafeText(l.text), MARGIN.left + 12, doc.y, { width }).moveDown(0.1);
    const end = doc.y;
    if (end > y) doc.rect(MARGIN.left, y, 3, end - y).fillColor(colour).fill();
    doc.y = end + 6;
  }
}

function historyBlock(doc: Doc, brief: BriefModel): void {
  heading(doc, "Review history");
  if (brief.history.length === 0) {
    paragraph(doc, "Nothing recorded yet.", { colour: MUTED });
    return;
  }
  const w = contentWidth(doc);
  const colAt = 100;
  const colWho = 96;
  for (const e of brief.history) {
    const text = pdfSafeText(e.text);
    doc.font("regular").fontSize(8.5);
    const h = doc.heightOfString(text, { width: w - colAt - colWho });
    ensureSpace(doc, h + 3);
    const y = doc.y;
    doc.font("regular").fontSize(7.5).fillColor(MUTED).text(e.at, MARGIN.left, y + 0.5, { width: colAt - 4 });
    doc.font("medium").fontSize(8.5).fillColor(INK).text(pdfSafeText(e.actor), MARGIN.left + colAt, y, { width: colWho - 4 });
    doc.font("regular").fontSize(8.5).fillColor(INK).text(text, MARGIN.left + colAt + colWho, y, { width: w - colAt - colWho });
    doc.y = Math.max(doc.y, y + h) + 3;
  }
}

function clearanceBlock(doc: Doc, brief: BriefModel): void {
  heading(doc, "Clearance for tape-out");
  const c = brief.clearance;
  if (!c) {
    paragraph(doc, `Not cleared for tape-out. The revision is ${brief.revision.stateLabel.toLowerCase()}.`, { colour: MUTED });
    return;
  }
  labelledRows(doc, [
    ["Signed by", c.by],
    ["When", c.at],
    ["Fab", c.fabName],
    ["Process", c.process],
    ["SHA-256", c.fileSha256],
    ["Analysis", `${c.analysisId}`],
  ]);
  if (!c.matchesRevision) paragraph(doc, "Warning: the signed SHA-256 differs from this revision's file.", { colour: TONE.over, font: "bold" });
  else paragraph(doc, "The signed SHA-256 matches this revision's file.", { colour: TONE.ok, size: 8.5 });
}

function footers(doc: Doc, brief: BriefModel): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - 44;
    doc.moveTo(MARGIN.left, y - 6).lineTo(doc.page.width - MARGIN.right, y - 6).lineWidth(0.4).strokeColor(RULE).stroke();
    doc.font("regular").fontSize(6.5).fillColor(MUTED).text(pdfSafeText(brief.footer), MARGIN.left, y, { width: contentWidth(doc) - 54, lineBreak: true });
    doc.font("regular").fontSize(7.5).fillColor(MUTED).text(`Page ${i - range.start + 1} of ${range.count}`, doc.page.width - MARGIN.right - 50, y, { width: 50, align: "right", lineBreak: false });
    doc.page.margins.bottom = bottom;
  }
}

/**
 * The brief as PDF bytes.
 * @param brief the content model (buildBrief)
 * @returns a Buffer starting with "%PDF-"
 */
export async function renderBriefPdf(brief: BriefModel): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margins: MARGIN,
    bufferPages: true,
    font: FONTS.regular,
    info: {
      Title: pdfSafeText(`${brief.title} — revision ${brief.revision.number} brief`),
      Author: pdfSafeText(brief.workspaceName),
      Subject: `SHA-256 ${brief.revision.sha256}`,
      Creator: "Stokeline",
      CreationDate: new Date(brief.generatedAtIso),
    },
  });
  for (const [name, file] of Object.entries(FONTS)) doc.registerFont(name, file);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  titleBlock(doc, brief);
  figuresTable(doc, brief);
  cautionsBox(doc, brief);
  if (brief.drawing) drawingBlock(doc, brief.drawing);
  flagsBlock(doc, brief);
  clearanceBlock(doc, brief);
  historyBlock(doc, brief);
  footers(doc, brief);
  doc.end();
  return done;
}
