/**
 * A DXF group scanner over a range of the text itself: the groups and values dxf-parser's scanner gives for the same
 * lines, so dxf-parser's entity handlers and ours run on it unchanged; its failures are LayoutErrors in our words.
 * Written here because dxf-parser's scanner needs the whole file split into a line array first: half of its parse
 * time and a string per line held to the end.
 */
import { LayoutError } from "../errors";

export interface Group {
  code: number;
  value: number | string | boolean;
}

/** What entity handlers use of a scanner: this one, or dxf-parser's DxfArrayScanner when dxf-parser drives them. */
export interface GroupScanner {
  next(): Group;
  isEOF(): boolean;
  rewind(numberOfGroups?: number): void;
  lastReadGroup: Group;
}

/** The user-facing answer to a file that ends (or reaches its EOF marker) inside a section. */
export const TRUNCATED_MESSAGE = "The DXF ends in the middle of a section: the file is truncated. Upload the complete file again.";

const TEXT = 0;
const REAL = 1;
const INTEGER = 2;
const FLAG = 3;
const LAST_TYPED_CODE = 1071;

/**
 * Value type of each group code 0…1071 (DXF reference, "Group code value types": reals 10-59, 110-149, 210-239,
 * 460-469, 1010-1059; integers 60-79, 90-99, 160-179, 270-289, 370-389, 400-409, 420-429, 440-459, 1060-1071;
 * boolean flags 290-299; text elsewhere). Codes the reference leaves unassigned are kept as text.
 */
const VALUE_TYPE = ((): Uint8Array => {
  const table = new Uint8Array(LAST_TYPED_CODE + 1); // TEXT by default
  const ranges: [number, number, number][] = [
    [10, 59, REAL], [110, 149, REAL], [210, 239, REAL], [460, 469, REAL], [1010, 1059, REAL],
    [60, 79, INTEGER], [90, 99, INTEGER], [160, 179, INTEGER], [270, 289, INTEGER], [370, 389, INTEGER],
    [400, 409, INTEGER], [420, 429, INTEGER], [440, 459, INTEGER], [1060, 1071, INTEGER],
    [290, 299, FLAG],
  ];
  for (const [first, last, type] of ranges) table.fill(type, first, last + 1);
  return table;
})();

/** A boolean flag group (290-299) holds 0 or 1; anything else means the lines are out of step. */
function readFlag(code: number, value: string): boolean {
  if (value === "1") return true;
  if (value === "0") return false;
  throw new LayoutError(
    "unreadable_dxf",
    `The DXF has a yes/no group (code ${code}) whose value is "${value.slice(0, 40)}" instead of 0 or 1: the file is damaged there. Export it again as an ASCII DXF.`,
  );
}

const HISTORY = 16;

/**
 * Groups of text[from, to). Lines end at "\n" or "\r\n"; the caller makes sure the range holds no lone "\r"
 * (dxf-parser also splits there). Rewinds up to 16 groups, more than any handler uses (dxf-parser's use at most 2).
 * next() throws LayoutError truncated_file when the range ends before the EOF group, or when asked for a group
 * after it (a section still open at the EOF marker).
 */
export class TextScanner {
  public lastReadGroup!: Group;
  private pos: number;
  private eof = false;
  private readonly text: string;
  private readonly to: number;
  /** Start offsets of the last groups read, a ring: rewind steps back through it. */
  private readonly starts = new Float64Array(HISTORY);
  private count = 0;

  constructor(text: string, from: number, to: number) {
    this.text = text;
    this.pos = from;
    this.to = to;
  }

  /** Offset of the next group's code line. */
  get position(): number {
    return this.pos;
  }

  /** Offset of the code line of the last group read. */
  get lastGroupStart(): number {
    return this.count > 0 ? this.starts[(this.count - 1) % HISTORY] : -1;
  }

  isEOF(): boolean {
    return this.eof;
  }

  next(): Group {
    const text = this.text;
    const start = this.pos;
    // A group needs its code line ended inside the range; past the EOF group nothing belongs to the drawing.
    const codeEnd = this.eof || start >= this.to ? -1 : text.indexOf("\n", start);
    if (codeEnd === -1 || codeEnd >= this.to) throw new LayoutError("truncated_file", TRUNCATED_MESSAGE);
    let valueEnd = text.indexOf("\n", codeEnd + 1);
    if (valueEnd === -1 || valueEnd > this.to) valueEnd = this.to;
    const code = parseCode(text, start, codeEnd > start && text.charCodeAt(codeEnd - 1) === 13 ? codeEnd - 1 : codeEnd);
    const vEnd = valueEnd > codeEnd + 1 && text.charCodeAt(valueEnd - 1) === 13 ? valueEnd - 1 : valueEnd;
    // Codes outside the table (negative, NaN, above 1071) are text.
    const type = code >= 0 && code <= LAST_TYPED_CODE ? VALUE_TYPE[code] : TEXT;
    let value: number | string | boolean;
    if (type === REAL) {
      const fast = parseDecimal(text, codeEnd + 1, vEnd);
      // parseFloat and parseInt skip the same leading white space trim() removes, and ignore what follows the number.
      value = fast === fast ? fast : parseFloat(text.slice(codeEnd + 1, vEnd));
    } else if (type === INTEGER) value = parseInt(text.slice(codeEnd + 1, vEnd));
    else if (type === FLAG) value = readFlag(code, text.slice(codeEnd + 1, vEnd).trim());
    else value = text.slice(codeEnd + 1, vEnd).trim();
    this.starts[this.count % HISTORY] = start;
    this.count++;
    this.pos = valueEnd + 1;
    const group: Group = { code, value };
    if (code === 0 && value === "EOF") this.eof = true;
    this.lastReadGroup = group;
    return group;
  }

  rewind(numberOfGroups = 1): void {
    if (numberOfGroups > Math.min(this.count, HISTORY)) throw new Error("TextScanner: rewind beyond its history");
    this.count -= numberOfGroups;
    this.pos = this.starts[this.count % HISTORY];
  }
}

/** parseInt of the code line, without a substring for the common shape (optional blanks, digits, optional blanks). */
function parseCode(text: string, from: number, to: number): number {
  let i = from;
  while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  let v = 0;
  let digits = 0;
  while (i < to) {
    const c = text.charCodeAt(i);
    if (c < 48 || c > 57) break;
    v = v * 10 + (c - 48);
    digits++;
    i++;
  }
  let j = i;
  while (j < to && (text.charCodeAt(j) === 32 || text.charCodeAt(j) === 9)) j++;
  if (digits > 0 && digits < 10 && j === to) return v;
  return parseInt(text.slice(from, to));
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * A plain decimal ([blanks][-]digits[.digits][blanks], at most 15 digits) without a substring, else NaN (the caller
 * then uses parseFloat). Exact: mantissa and power of ten are both exact doubles, so the one division is correctly
 * rounded and equals parseFloat (Clinger's fast path: W. D. Clinger, "How to read floating point numbers accurately", PLDI 1990).
 */
function parseDecimal(text: string, from: number, to: number): number {
  let i = from;
  while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  let negative = false;
  if (i < to && text.charCodeAt(i) === 45) {
    negative = true;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = -1;
  for (; i < to; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (fraction >= 0) fraction++;
    } else if (c === 46 && fraction < 0) fraction = 0;
    else break;
  }
  while (i < to && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  if (i !== to || digits === 0 || digits > 15) return NaN;
  const v = fraction > 0 ? mantissa / POW10[fraction] : mantissa;
  return negative ? -v : v;
}
