/**
 * CSV export of what a table shows. RFC 4180: fields holding a comma, a double
 * quote or a line break are quoted, quotes doubled, records end in CRLF. Field
 * quoting is d3-dsv's csvFormatRow (installed with d3); this module only joins
 * records with CRLF (d3 joins with LF), writes numbers, and guards text against
 * spreadsheet formula injection. Pure.
 */
import { csvFormatRow } from "d3";
import { DomainError } from "../errors";
import type { AnalyzeJson } from "./serialize";
import { createQuantityReader, formatQuantity, getQuantity, quantityHeader, toDisplayValue, type QuantityKey, type UnitPreferences } from "./quantities";

export type CsvCell = string | number | boolean | null | undefined;

export interface CsvOptions {
  /**
   * Prefix text cells that a spreadsheet would run as a formula (starting with
   * = + - @, tab or CR) with an apostrophe, as OWASP's "CSV Injection" page
   * advises. Numbers, and text that is a plain number like "-1.5e-3", are left alone.
   * Default true: layer and port names come from uploaded files.
   */
  guardFormulas?: boolean;
}

const CRLF = "\r\n";
const PLAIN_NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i;
const FORMULA_START = /^[=+\-@\t\r]/;

function cellText(cell: CsvCell, guard: boolean): string {
  if (cell === null || cell === undefined) return "";
  if (typeof cell === "number") return Number.isFinite(cell) ? String(cell) : "";
  if (typeof cell === "boolean") return cell ? "true" : "false";
  if (guard && FORMULA_START.test(cell) && !PLAIN_NUMBER.test(cell)) return `'${cell}`;
  return cell;
}

/**
 * Write records as RFC 4180 CSV, each record (the last too) ending in CRLF.
 * @param rows records; the first is usually the header
 */
export function formatCsv(rows: readonly (readonly CsvCell[])[], options: CsvOptions = {}): string {
  const guard = options.guardFormulas ?? true;
  return rows.map((row) => csvFormatRow(row.map((c) => cellText(c, guard))) + CRLF).join("");
}

export interface SegmentCsvOptions extends CsvOptions {
  /** Segment ids in the order the table shows them (sorted, filtered); default all, in document order. */
  segmentIds?: readonly string[];
  /** "display": the numbers as shown (engineering precision); "full": every digit of the converted value. Default "display". */
  precision?: "display" | "full";
}

/**
 * The segment table as CSV: an id and layer column, then one column per
 * quantity with its unit in the header, values in the member's units.
 * @throws DomainError 400 when a requested segment id is not in the document.
 */
export function segmentsToCsv(
  doc: AnalyzeJson,
  quantityKeys: readonly QuantityKey[],
  prefs: UnitPreferences = {},
  options: SegmentCsvOptions = {},
): string {
  const defs = quantityKeys.map(getQuantity);
  const byId = new Map(doc.segments.map((s) => [s.id, s]));
  const ids = options.segmentIds ?? doc.segments.map((s) => s.id);
  const missing = ids.filter((id) => !byId.has(id));
  if (missing.length > 0) {
    throw new CsvExportError(`These segments are not in this analysis: ${missing.slice(0, 5).join(", ")}${missing.length > 5 ? "…" : ""}. Reload the table and export again.`);
  }
  const read = createQuantityReader(doc);
  const header: CsvCell[] = ["Segment", "Layer", ...defs.map((d) => quantityHeader(d, prefs))];
  const rows: CsvCell[][] = ids.map((id) => {
    const seg = byId.get(id)!;
    return [
      seg.id,
      seg.layer,
      ...defs.map((d) => {
        const si = read(d.key, seg);
        if (si === null) return null;
        return options.precision === "full" ? toDisplayValue(d, si, prefs) : formatQuantity(d, si, prefs);
      }),
    ];
  });
  return formatCsv([header, ...rows], options);
}

/** A CSV export asked for rows the document does not have (400). */
export class CsvExportError extends DomainError {
  constructor(message: string) {
    super("csv_export_invalid", message, 400);
  }
}
