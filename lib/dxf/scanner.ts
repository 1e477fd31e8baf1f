/**
 * A DXF group scanner over a range of the text itself, with the semantics of
 * dxf-parser's DxfArrayScanner (same values, same errors, same rewind), so
 * dxf-parser's entity handlers and ours run on it unchanged.
 * Written here because dxf-parser's scanner needs the whole file split into a
 * line array first: half of its parse time and a string per line held to the end.
 */

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

/** DXF group value by code range, exactly as dxf-parser's parseGroupValue (DXF reference, group code value types). */
function parseGroupValue(code: number, value: string): number | string | boolean {
  if (code <= 9) return value;
  if (code >= 10 && code <= 59) return parseFloat(value);
  if (code >= 60 && code <= 99) return parseInt(value);
  if (code >= 100 && code <= 109) return value;
  if (code >= 110 && code <= 149) return parseFloat(value);
  if (code >= 160 && code <= 179) return parseInt(value);
  if (code >= 210 && code <= 239) return parseFloat(value);
  if (code >= 270 && code <= 289) return parseInt(value);
  if (code >= 290 && code <= 299) {
    if (value === "0") return false;
    if (value === "1") return true;
    throw TypeError("String '" + value + "' cannot be cast to Boolean type");
  }
  if (code >= 300 && code <= 369) return value;
  if (code >= 370 && code <= 389) return parseInt(value);
  if (code >= 390 && code <= 399) return value;
  if (code >= 400 && code <= 409) return parseInt(value);
  if (code >= 410 && code <= 419) return value;
  if (code >= 420 && code <= 429) return parseInt(value);
  if (code >= 430 && code <= 439) return value;
  if (code >= 440 && code <= 459) return parseInt(value);
  if (code >= 460 && code <= 469) return parseFloat(value);
  if (code >= 470 && code <= 481) return value;
  if (code === 999) return value;
  if (code >= 1000 && code <= 1009) return value;
  if (code >= 1010 && code <= 1059) return parseFloat(value);
  if (code >= 1060 && code <= 1071) return parseInt(value);
  return value;
}

const HISTORY = 16;

/**
 * Groups of text[from, to). Lines end at "\n" or "\r\n"; the caller makes sure the range holds no lone "\r"
 * (dxf-parser also splits there). Rewinds up to 16 groups, more than any handler uses (dxf-parser's use at most 2).
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
    const codeEnd = start < this.to ? text.indexOf("\n", start) : -1;
    if (codeEnd === -1 || codeEnd >= this.to || this.eof) {
      if (!this.eof) {
        // dxf-parser's message names the last line: "" after a final newline, undefined past the end.
        const last = start < this.to ? text.slice(start, this.to) : start === this.to ? "" : undefined;
        throw new Error("Unexpected end of input: EOF group not read before end of file. Ended on code " + last);
      }
      throw new Error("Cannot call 'next' after EOF group has been read");
    }
    let valueEnd = text.indexOf("\n", codeEnd + 1);
    if (valueEnd === -1 || valueEnd > this.to) valueEnd = this.to;
    const code = parseCode(text, start, codeEnd > start && text.charCodeAt(codeEnd - 1) === 13 ? codeEnd - 1 : codeEnd);
    const vEnd = valueEnd > codeEnd + 1 && text.charCodeAt(valueEnd - 1) === 13 ? valueEnd - 1 : valueEnd;
    let value: number | string | boolean;
    if ((code >= 10 && code <= 59) || (code >= 210 && code <= 239)) {
      const fast = parseDecimal(text, codeEnd + 1, vEnd);
      // Numbers parse the same with or without surrounding white space (parseFloat skips it; trim removes the same set).
      value = fast === fast ? fast : parseFloat(text.slice(codeEnd + 1, vEnd));
    } else value = parseGroupValue(code, text.slice(codeEnd + 1, vEnd).trim());
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
