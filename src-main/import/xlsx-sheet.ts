import { CellKind, GridBuilder, type CellKindCode, type SheetGrid } from '../../src-shared/import/cells';
import { serialToIso } from '../../src-shared/import/excel-dates';
import { ImportError } from '../../src-shared/import/import-error';
import { stopIfCancelled } from './import-cancelled';
import { nextTurn } from './next-turn';
import type { WorkbookInfo, SheetEntry } from './xlsx-package';
import { unescapeXml } from './xml-text';

/**
 * Reads one worksheet part into a SheetGrid with a byte-level scanner made
 * for the few elements a worksheet's data uses (row, c, v, is/t, f,
 * mergeCell); the general XML parser is used for the small parts of the
 * package, but is too slow for 200k-row sheets.
 *
 * Formulas are not evaluated: a formula cell gives its cached value (<v>),
 * error cells keep their error text (#DIV/0!, #N/A ...), number cells whose
 * style is a date format become ISO dates. Element names may carry any
 * namespace prefix (x:c). <mergeCells> are kept so that merged headers can
 * be filled across.
 */
export interface SheetReadControl {
  /** Called after each chunk of the part: the fraction of its bytes read, a stage sentence, the spreadsheet row reached. */
  onProgress?: (fraction: number, stage: string, rows: number) => void;
  /** Checked before each chunk; when aborted, the read rejects with ImportCancelled. */
  signal?: AbortSignal;
}

const LT = 60;
const GT = 62;
const SLASH = 47;
const QUOTE = 34;
const APOS = 39;
const EQ = 61;
const COLON = 58;
const stepBytes = 1 << 20;
const Tag = { other: 0, c: 1, v: 2, t: 3, is: 4, row: 5, rPh: 6, sheetData: 7, mergeCell: 8 } as const;

class SheetScanner {
  private readonly text: (from: number, to: number) => string;
  private readonly intTexts: string[] = [];
  private readonly isoBySerial = new Map<number, string>();
  row = 0;
  col = 0;
  pos = 0;
  /** Set once </sheetData> is seen: a part cut short never gets there. */
  complete = false;
  // the cell being read
  private type = 0; // char code of the t attribute's first letter, with inlineStr as 'i'
  private style = 0;
  private value = '';
  private inline = '';
  private hasValue = false;
  private inIs = false;

  private readonly bytes: Uint8Array;

  constructor(
    bytes: Uint8Array,
    private readonly info: WorkbookInfo,
    private readonly grid: GridBuilder,
  ) {
    // A plain Uint8Array view: its indexOf is a fast built-in, Buffer's is not.
    this.bytes = new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    this.text = (from, to) => buf.toString('utf8', from, to);
  }

  /** Index just past the element name starting at i (after '<' and an optional '/'); name may have a prefix. */
  private nameEnd(i: number): number {
    const b = this.bytes;
    while (i < b.length) {
      const c = b[i];
      if (c === 32 || c === GT || c === SLASH || c === 9 || c === 10 || c === 13) break;
      i++;
    }
    return i;
  }

  /** Which of the few elements read here the name between from and to is (prefix ignored), by its bytes. */
  private tagId(from: number, to: number): number {
    const b = this.bytes;
    let start = from;
    for (let k = from; k < to; k++) if (b[k] === COLON) start = k + 1;
    const len = to - start;
    const c = b[start];
    if (len === 1) return c === 99 ? Tag.c : c === 118 ? Tag.v : c === 116 ? Tag.t : Tag.other;
    if (len === 2) return c === 105 && b[start + 1] === 115 ? Tag.is : Tag.other;
    if (len === 3 && c === 114) return b[start + 1] === 111 && b[start + 2] === 119 ? Tag.row : b[start + 1] === 80 && b[start + 2] === 104 ? Tag.rPh : Tag.other;
    if (len === 9) {
      const name = this.localName(start, to);
      return name === 'sheetData' ? Tag.sheetData : name === 'mergeCell' ? Tag.mergeCell : Tag.other;
    }
    return Tag.other;
  }

  /** Local element name between from and to, as a short string. */
  private localName(from: number, to: number): string {
    const b = this.bytes;
    let start = from;
    for (let k = from; k < to; k++) if (b[k] === COLON) start = k + 1;
    let s = '';
    for (let k = start; k < to && k - start < 16; k++) s += String.fromCharCode(b[k]);
    return s;
  }

  /** End of the tag (index of its '>'), skipping quoted attribute values. */
  private tagEnd(i: number): number {
    const b = this.bytes;
    let quote = 0;
    for (; i < b.length; i++) {
      const c = b[i];
      if (quote) {
        if (c === quote) quote = 0;
      } else if (c === QUOTE || c === APOS) quote = c;
      else if (c === GT) return i;
    }
    throw new Error('a tag is not closed (the file ends inside a tag)');
  }

  /** Attributes of the tag between from and to: calls back with local name and raw value. */
  private attrs(from: number, to: number, each: (name: string, value: string) => void): void {
    const b = this.bytes;
    let i = from;
    while (i < to) {
      while (i < to && (b[i] === 32 || b[i] === 9 || b[i] === 10 || b[i] === 13)) i++;
      const nameStart = i;
      while (i < to && b[i] !== EQ && b[i] !== 32) i++;
      if (i >= to) return;
      const name = this.localName(nameStart, i);
      while (i < to && b[i] !== QUOTE && b[i] !== APOS) i++;
      const q = b[i];
      const vStart = ++i;
      while (i < to && b[i] !== q) i++;
      each(name, this.text(vStart, i));
      i++;
    }
  }

  /** The r attribute of a <row> tag as a number (0 when absent). */
  private rowAttr(from: number, to: number): number {
    const b = this.bytes;
    for (let i = from; i < to - 3; i++) {
      if (b[i] === 114 && b[i + 1] === EQ && (b[i - 1] === 32 || b[i - 1] === COLON || b[i - 1] === 9 || b[i - 1] === 10)) {
        let n = 0;
        for (let k = i + 3; k < to && b[k] >= 48 && b[k] <= 57; k++) n = n * 10 + (b[k] - 48);
        return n;
      }
    }
    return 0;
  }

  /** The r, t and s attributes of a <c> tag, read from the bytes without making strings. */
  private cellAttrs(from: number, to: number): void {
    const b = this.bytes;
    this.type = 0;
    this.style = 0;
    let haveRef = false;
    let i = from;
    while (i < to) {
      while (i < to && (b[i] === 32 || b[i] === 9 || b[i] === 10 || b[i] === 13)) i++;
      const nameStart = i;
      while (i < to && b[i] !== EQ) i++;
      if (i >= to) break;
      let ns = nameStart;
      for (let k = nameStart; k < i; k++) if (b[k] === COLON) ns = k + 1;
      const one = i - ns === 1 ? b[ns] : 0;
      while (i < to && b[i] !== QUOTE && b[i] !== APOS) i++;
      const q = b[i];
      const vStart = ++i;
      while (i < to && b[i] !== q) i++;
      const vEnd = i++;
      if (one === 114) {
        // r="AB12"
        let col = 0;
        let k = vStart;
        for (; k < vEnd; k++) {
          const c = b[k] & ~32;
          if (c < 65 || c > 90) break;
          col = col * 26 + (c - 64);
        }
        let row = 0;
        for (; k < vEnd; k++) row = row * 10 + (b[k] - 48);
        this.col = col;
        if (row) this.row = row;
        haveRef = true;
      } else if (one === 116) {
        // t="s" | "str" | "inlineStr" | "n" | "b" | "e" | "d"
        const c = b[vStart];
        this.type = c === 105 ? 105 : c === 115 && vEnd - vStart === 3 ? 1 : c === 110 ? 0 : c;
      } else if (one === 115) {
        let n = 0;
        for (let k = vStart; k < vEnd; k++) n = n * 10 + (b[k] - 48);
        this.style = n;
      }
    }
    if (!haveRef) this.col++;
  }

  private numberText(from: number, to: number): string {
    const b = this.bytes;
    const len = to - from;
    if (len > 0 && len <= 6) {
      let n = 0;
      let k = from;
      for (; k < to; k++) {
        const c = b[k] - 48;
        if (c < 0 || c > 9) break;
        n = n * 10 + c;
      }
      if (k === to && !(len > 1 && b[from] === 48)) return (this.intTexts[n] ??= String(n));
    }
    return this.text(from, to);
  }

  private parseRef(ref: string): void {
    let col = 0;
    let i = 0;
    for (; i < ref.length; i++) {
      const c = ref.charCodeAt(i) & ~32;
      if (c < 65 || c > 90) break;
      col = col * 26 + (c - 64);
    }
    this.col = col;
    if (i < ref.length) this.row = Number(ref.slice(i));
  }

  private finishCell(): void {
    const { sharedStrings, dateStyles, date1904 } = this.info;
    let kind: CellKindCode = CellKind.blank;
    let text = '';
    let number = Number.NaN;
    const v = this.value;
    switch (this.type) {
      case 115: // s
        if (this.hasValue) {
          text = sharedStrings[Number(v)] ?? '';
          kind = CellKind.text;
        }
        break;
      case 105: // inlineStr
        text = this.inline;
        kind = CellKind.text;
        break;
      case 101: // e (error)
        text = v;
        kind = CellKind.error;
        break;
      case 98: // b
        number = v === '1' || v === 'true' ? 1 : 0;
        text = number ? 'TRUE' : 'FALSE';
        kind = CellKind.bool;
        break;
      case 100: // d (ISO date text)
        text = v.replace(/T00:00(:00(\.0+)?)?Z?$/, '');
        kind = CellKind.date;
        number = Number.NaN;
        break;
      case 1: // str (formula string)
        text = v;
        kind = this.hasValue ? CellKind.text : CellKind.blank;
        break;
      default:
        if (!this.hasValue || v === '') {
          if (this.inline !== '') {
            text = this.inline;
            kind = CellKind.text;
          }
          break;
        }
        number = Number(v);
        if (Number.isNaN(number)) {
          text = v;
          kind = CellKind.text;
          break;
        }
        if (dateStyles[this.style]) {
          let iso = this.isoBySerial.get(number);
          if (iso === undefined) {
            iso = serialToIso(number, date1904) ?? '';
            this.isoBySerial.set(number, iso);
          }
          if (iso !== '') {
            text = iso;
            kind = CellKind.date;
            break;
          }
        }
        text = v;
        kind = CellKind.number;
    }
    if (kind !== CellKind.blank && this.row > 0 && this.col > 0) this.grid.set(this.row, this.col, kind, text, number);
  }

  /** Text content from i up to the next '<' (CDATA sections read as they are). */
  private content(i: number): { text: string; end: number } {
    const b = this.bytes;
    let end = b.indexOf(LT, i);
    if (end < 0) end = b.length;
    if (b[end + 1] === 33 && b[end + 2] === 91) {
      // <![CDATA[ ... ]]>
      const close = Buffer.from(b.buffer, b.byteOffset, b.byteLength).indexOf(']]>', end);
      const t = this.text(end + 9, close < 0 ? b.length : close);
      return { text: t, end: close < 0 ? b.length : close + 3 };
    }
    return { text: unescapeXml(this.text(i, end)), end };
  }

  /** Scans up to `limit` (or the end); returns false when done. */
  step(limit: number): boolean {
    const b = this.bytes;
    let i = this.pos;
    while (i < limit) {
      const lt = b.indexOf(LT, i);
      if (lt < 0) {
        i = b.length;
        break;
      }
      const closing = b[lt + 1] === SLASH;
      const nameStart = closing ? lt + 2 : lt + 1;
      const c0 = b[nameStart];
      if (c0 === 63 || c0 === 33) {
        // <?...?> or <!-- --> / <!DOCTYPE>
        const end = c0 === 33 && b[nameStart + 1] === 45 ? Buffer.from(b.buffer, b.byteOffset, b.byteLength).indexOf('-->', lt) + 2 : this.tagEnd(lt);
        if (end < 2) throw new Error('a comment is not closed');
        i = end + 1;
        continue;
      }
      const ne = this.nameEnd(nameStart);
      const tag = this.tagId(nameStart, ne);
      const gt = this.tagEnd(ne);
      const selfClosing = b[gt - 1] === SLASH;
      i = gt + 1;
      if (closing) {
        if (tag === Tag.c) this.finishCell();
        else if (tag === Tag.sheetData) this.complete = true;
        else if (tag === Tag.is) this.inIs = false;
        continue;
      }
      switch (tag) {
        case Tag.row: {
          const r = this.rowAttr(ne, selfClosing ? gt - 1 : gt);
          this.row = r || this.row + 1;
          this.col = 0;
          break;
        }
        case Tag.c: {
          this.cellAttrs(ne, selfClosing ? gt - 1 : gt);
          this.value = '';
          this.inline = '';
          this.hasValue = false;
          this.inIs = false;
          if (selfClosing) this.finishCell();
          break;
        }
        case Tag.v: {
          if (selfClosing) break;
          if (this.type === 0 || this.type === 115) {
            const end = b.indexOf(LT, i);
            this.value = this.type === 0 ? this.numberText(i, end) : this.text(i, end);
            i = end;
          } else {
            const c = this.content(i);
            this.value = c.text;
            i = c.end;
          }
          this.hasValue = true;
          break;
        }
        case Tag.is:
          if (!selfClosing) this.inIs = true;
          break;
        case Tag.t: {
          if (selfClosing || !this.inIs) break;
          const c = this.content(i);
          this.inline += c.text;
          i = c.end;
          break;
        }
        case Tag.rPh: {
          // phonetic hints inside an inline string: skip to their end
          if (selfClosing) break;
          const close = Buffer.from(b.buffer, b.byteOffset, b.byteLength).indexOf('rPh>', i);
          i = close < 0 ? b.length : close + 4;
          break;
        }
        case Tag.mergeCell: {
          let ref = '';
          this.attrs(ne, selfClosing ? gt - 1 : gt, (n, v) => {
            if (n === 'ref') ref = v;
          });
          if (ref) {
            const [from, to] = ref.split(':');
            this.parseRef(from);
            const top = this.row;
            const left = this.col;
            this.parseRef(to ?? from);
            this.grid.merges.push({ top, left, bottom: this.row, right: this.col });
          }
          break;
        }
        default:
      }
    }
    this.pos = i;
    return i < b.length;
  }
}

export async function readSheet(bytes: Uint8Array, file: string, entry: SheetEntry, info: WorkbookInfo, control: SheetReadControl = {}): Promise<SheetGrid> {
  const grid = new GridBuilder();
  const scanner = new SheetScanner(bytes, info, grid);
  const text = new TextDecoder().decode(bytes.subarray(0, Math.min(bytes.length, 512)));
  if (!/<(\w+:)?worksheet[\s>]/.test(text) && !/<(\w+:)?worksheet[\s>]/.test(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength).toString('utf8', 0, Math.min(bytes.length, 4096)))) {
    throw new ImportError('damaged-workbook', `${file}: sheet "${entry.name}" is not a worksheet (it may be a chart sheet or damaged). Choose another sheet, or save the file again.`, { file, sheet: entry.name });
  }
  try {
    let limit = 0;
    let more = true;
    while (more) {
      stopIfCancelled(control.signal, file, { sheet: entry.name });
      limit = Math.min(bytes.length, limit + stepBytes);
      more = scanner.step(limit);
      control.onProgress?.(Math.min(1, scanner.pos / bytes.length), `reading sheet "${entry.name}"`, scanner.row);
      if (more && (control.signal || control.onProgress)) await nextTurn();
    }
    if (!scanner.complete) throw new Error('the sheet ends before its data is closed; the file is cut short');
  } catch (e) {
    if (e instanceof ImportError) throw e;
    const near = scanner.row ? ` near row ${scanner.row}` : '';
    throw new ImportError('damaged-workbook', `${file}: sheet "${entry.name}" cannot be read${near} (${(e as Error).message}). Open the file in a spreadsheet program and save it again.`, { file, sheet: entry.name, row: scanner.row || undefined });
  }
  return grid.finish(file, entry.name, entry.hidden);
}
