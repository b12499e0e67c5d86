/**
 * The calc sheet as a PDF (pdfkit, Barlow embedded). Node only: it reads the font files from
 * the installed @fontsource/barlow package at run time, so it is used by the server and the
 * headless checker and never by the client bundle (ESLint keeps src/ from importing it).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { pageLabel, type CalcSheet, type SheetElement, type SheetRow } from './calc-sheet';
import { woffToSfnt } from './woff';

const require = createRequire(import.meta.url);

/** Barlow (SIL Open Font License 1.1, @fontsource/barlow), latin subset, WOFF. */
const FONT_FILES = {
  regular: '@fontsource/barlow/files/barlow-latin-400-normal.woff',
  semibold: '@fontsource/barlow/files/barlow-latin-600-normal.woff',
} as const;

let fontCache: { regular: Buffer; semibold: Buffer } | undefined;

/** The two Barlow weights as TrueType, decoded once per process. */
function loadFonts(): { regular: Buffer; semibold: Buffer } {
  fontCache ??= {
    regular: woffToSfnt(readFileSync(require.resolve(FONT_FILES.regular))),
    semibold: woffToSfnt(readFileSync(require.resolve(FONT_FILES.semibold))),
  };
  return fontCache;
}

const REGULAR = 'Barlow';
const SEMIBOLD = 'Barlow-SemiBold';

const COLORS = {
  ink: '#1d232c',
  text: '#364151',
  muted: '#55667c',
  rule: '#cbd3dc',
  band: '#f4f6f8',
  accent: '#a35822',
  fail: '#b91c1c',
  warn: '#92400e',
} as const;

const STATUS_COLORS: Record<string, string> = {
  pass: '#166534',
  marginal: '#92400e',
  fail: COLORS.fail,
  review: '#6b21a8',
  invalid: COLORS.muted,
};

const PAGE = { size: 'A4' as const, margin: 42, top: 58, bottom: 86 };

/**
 * Characters the latin subset of Barlow has no glyph for, written the way an engineer would
 * type them. Anything else outside the subset's range is decomposed (accents dropped) or
 * replaced by "?", so no page ever shows an empty box.
 */
const REPLACEMENTS: Record<string, string> = {
  '≥': '>=',
  '≤': '<=',
  '→': '->',
  '≈': '~',
  '√': 'sqrt',
  ν: 'nu',
  θ: 'theta',
  π: 'pi',
  Δ: 'delta',
  '″': '"',
  '′': "'",
  '⅛': '1/8',
  '⅜': '3/8',
  '⅝': '5/8',
  '⅞': '7/8',
  '⁶': '^6',
};

/** True when the latin subset of Barlow (its published unicode-range) has the code point. */
function inLatinSubset(cp: number): boolean {
  return (
    cp <= 0xff ||
    cp === 0x131 ||
    cp === 0x152 ||
    cp === 0x153 ||
    cp === 0x2bb ||
    cp === 0x2bc ||
    cp === 0x2c6 ||
    cp === 0x2da ||
    cp === 0x2dc ||
    (cp >= 0x2000 && cp <= 0x206f) ||
    cp === 0x20ac ||
    cp === 0x2122 ||
    cp === 0x2191 ||
    cp === 0x2193 ||
    cp === 0x2212 ||
    cp === 0x2215
  );
}

/** Text as the embedded font can show it. */
export function toPdfText(s: string): string {
  let out = '';
  for (const ch of s) {
    const cp = ch.codePointAt(0) ?? 0;
    if (inLatinSubset(cp)) out += ch;
    else if (REPLACEMENTS[ch] !== undefined) out += REPLACEMENTS[ch];
    else {
      const base = ch.normalize('NFD').replace(/[\u0300-\u036f]/g, '');
      out +=
        [...base].every((c) => inLatinSubset(c.codePointAt(0) ?? 0xffff)) && base !== ''
          ? base
          : '?';
    }
  }
  return out;
}

type Doc = PDFKit.PDFDocument;

/** Flowing layout over pdfkit: keeps blocks off the footer and starts new pages when needed. */
class Writer {
  readonly left: number;
  readonly width: number;
  constructor(readonly doc: Doc) {
    this.left = PAGE.margin;
    this.width = doc.page.width - 2 * PAGE.margin;
  }

  get y(): number {
    return this.doc.y;
  }

  get bottom(): number {
    return this.doc.page.height - PAGE.bottom;
  }

  newPage(): void {
    this.doc.addPage();
    this.doc.x = this.left;
    this.doc.y = PAGE.top;
  }

  /** Start a new page unless `height` more points fit on this one. */
  ensure(height: number): void {
    if (this.doc.y + height > this.bottom) this.newPage();
  }

  height(text: string, width: number, font: string, size: number): number {
    this.doc.font(font).fontSize(size);
    return this.doc.heightOfString(toPdfText(text), { width });
  }

  text(
    text: string,
    opts: {
      font?: string;
      size?: number;
      color?: string;
      gap?: number;
      x?: number;
      width?: number;
    } = {},
  ): void {
    const font = opts.font ?? REGULAR;
    const size = opts.size ?? 9;
    const width = opts.width ?? this.width;
    const x = opts.x ?? this.left;
    this.ensure(this.height(text, width, font, size));
    this.doc
      .font(font)
      .fontSize(size)
      .fillColor(opts.color ?? COLORS.text);
    this.doc.text(toPdfText(text), x, this.doc.y, { width });
    this.doc.y += opts.gap ?? 2;
    this.doc.x = this.left;
  }

  heading(text: string, size = 12): void {
    // A heading keeps at least a few lines of what follows on its page.
    this.ensure(size * 2 + 40);
    this.doc.y += size * 0.4;
    this.text(text, { font: SEMIBOLD, size, color: COLORS.ink, gap: 3 });
    const y = this.doc.y;
    this.doc
      .moveTo(this.left, y)
      .lineTo(this.left + this.width, y)
      .lineWidth(0.5)
      .strokeColor(COLORS.rule)
      .stroke();
    this.doc.y = y + 4;
  }

  /**
   * A table: column widths as fractions of the text width; cells wrap; a row that does not fit
   * goes to the next page with the header repeated.
   */
  table(
    header: readonly string[] | null,
    fractions: readonly number[],
    rows: readonly { cells: readonly string[]; strong?: boolean; flag?: string; color?: string }[],
    size = 8.5,
  ): void {
    const widths = fractions.map((f) => f * this.width);
    const pad = size < 8 ? 2 : 3;
    const drawRow = (
      cells: readonly string[],
      font: string,
      fill: string | null,
      color: string,
      flagIndex?: number,
    ) => {
      const h =
        Math.max(...cells.map((c, i) => this.height(c, (widths[i] ?? 0) - 2 * pad, font, size))) +
        2 * pad;
      if (this.doc.y + h > this.bottom) {
        this.newPage();
        if (header && cells !== header) drawRow(header, SEMIBOLD, COLORS.band, COLORS.muted);
      }
      const y = this.doc.y;
      if (fill) this.doc.rect(this.left, y, this.width, h).fill(fill);
      let x = this.left;
      cells.forEach((c, i) => {
        this.doc
          .font(flagIndex === i ? SEMIBOLD : font)
          .fontSize(size)
          .fillColor(flagIndex === i ? COLORS.warn : color)
          .text(toPdfText(c), x + pad, y + pad, { width: (widths[i] ?? 0) - 2 * pad });
        x += widths[i] ?? 0;
      });
      this.doc
        .moveTo(this.left, y + h)
        .lineTo(this.left + this.width, y + h)
        .lineWidth(0.3)
        .strokeColor(COLORS.rule)
        .stroke();
      this.doc.x = this.left;
      this.doc.y = y + h;
    };
    if (header) {
      // Keep the header with the first row.
      const first = rows[0]?.cells ?? [];
      const firstHeight =
        Math.max(
          0,
          ...first.map((c, i) => this.height(c, (widths[i] ?? 0) - 2 * pad, REGULAR, size)),
        ) +
        2 * pad;
      const headerHeight =
        Math.max(
          ...header.map((c, i) => this.height(c, (widths[i] ?? 0) - 2 * pad, SEMIBOLD, size)),
        ) +
        2 * pad;
      this.ensure(headerHeight + firstHeight);
      drawRow(header, SEMIBOLD, COLORS.band, COLORS.muted);
    }
    for (const r of rows) {
      const cells = r.flag
        ? [...r.cells.slice(0, -1), `${r.cells[r.cells.length - 1] ?? ''}  ${r.flag}`]
        : r.cells;
      drawRow(cells, r.strong ? SEMIBOLD : REGULAR, null, r.color ?? COLORS.text, undefined);
    }
    this.doc.y += 6;
  }

  rows(rows: readonly SheetRow[], withSource: boolean): void {
    this.table(
      withSource ? ['', 'value', 'source'] : null,
      withSource ? [0.36, 0.2, 0.44] : [0.55, 0.45],
      rows.map((r) => ({
        cells: withSource ? [r.label, r.value, r.source ?? ''] : [r.label, r.value],
        strong: r.strong,
        flag: r.fromMemory ? 'FROM MEMORY: verify' : undefined,
        color: r.strong && r.value.startsWith('ORDER HEAVIER') ? COLORS.fail : undefined,
      })),
    );
  }
}

function writeCover(w: Writer, sheet: CalcSheet): void {
  w.text(sheet.title, { font: SEMIBOLD, size: 16, color: COLORS.ink, gap: 2 });
  w.text(`${sheet.spoolName} · ${sheet.revisionLabel}`, {
    font: SEMIBOLD,
    size: 12,
    color: COLORS.accent,
    gap: 8,
  });
  // Identity two pairs to a row, so the cover keeps room for the conditions and the summary.
  const pairs: { cells: string[] }[] = [];
  for (let i = 0; i < sheet.identity.length; i += 2) {
    const a = sheet.identity[i]!;
    const b = sheet.identity[i + 1];
    pairs.push({ cells: [a.label, a.value, b?.label ?? '', b?.value ?? ''] });
  }
  w.table(null, [0.14, 0.36, 0.16, 0.34], pairs);

  w.heading('Design conditions');
  if (sheet.conditions.length > 0) w.rows(sheet.conditions, true);
  if (sheet.derived.length > 0) {
    w.text(
      'Values the check took for elements that keep the spool conditions (elements with their own conditions list theirs under their inputs):',
      {
        size: 8.5,
        color: COLORS.muted,
      },
    );
    w.rows(sheet.derived, true);
  }

  w.heading('Result summary');
  w.text(sheet.summary, { size: 9 });
  if (sheet.fromMemoryCount > 0) {
    w.text(
      `${sheet.fromMemoryCount} input value(s) are recalled from memory and flagged FROM MEMORY: verify them against the licensed edition.`,
      {
        size: 9,
        color: COLORS.warn,
        font: SEMIBOLD,
      },
    );
  }
  w.doc.y += 3;
  w.table(
    [
      'element',
      'kind',
      'size',
      'governing case',
      'ordered wall needed',
      'chosen wall',
      'margin',
      'status',
    ],
    [0.09, 0.09, 0.18, 0.15, 0.15, 0.12, 0.1, 0.12],
    sheet.overview.map((r) => ({
      cells: [r.id, r.kind, r.size, r.governing, r.orderedWall, r.chosenWall, r.margin, r.status],
      color: STATUS_COLORS[r.status.toLowerCase()] === COLORS.fail ? COLORS.fail : undefined,
    })),
  );

  w.heading('History of this revision');
  if (sheet.history.length > 0) {
    w.table(
      ['when', 'step', 'by', 'note'],
      [0.2, 0.22, 0.2, 0.38],
      sheet.history.map((h) => ({ cells: [h.when, h.move, h.who, h.note] })),
    );
  } else w.text(sheet.historyNote, { size: 9, color: COLORS.muted });
}

function writeElement(w: Writer, e: SheetElement): void {
  w.newPage();
  const color = STATUS_COLORS[e.status] ?? COLORS.text;
  w.text(`${e.title}`, { font: SEMIBOLD, size: 14, color: COLORS.ink, gap: 0 });
  w.text(`${e.statusLabel} · governed by ${e.governing}`, {
    font: SEMIBOLD,
    size: 10,
    color,
    gap: 2,
  });
  w.text(e.description, { size: 9, color: COLORS.muted, gap: 6 });

  if (e.issues.length > 0) {
    w.heading('Cannot be checked', 10);
    for (const i of e.issues) w.text(i, { size: 9, color: COLORS.fail });
  }

  w.heading('Check', 10);
  w.table(
    null,
    [0.45, 0.25, 0.3],
    e.figures.map((f) => ({ cells: [f.label, f.value, f.source ?? ''], strong: f.strong })),
  );

  if (e.cases.length > 1) {
    w.heading('Cases', 10);
    const external = e.cases.some((c) => c.allowablePressure !== '—');
    w.table(
      [
        'location',
        'equation',
        'I',
        't',
        'tm',
        'ordered wall',
        ...(external ? ['allowable ext.'] : []),
      ],
      external ? [0.2, 0.16, 0.08, 0.13, 0.13, 0.15, 0.15] : [0.22, 0.2, 0.1, 0.16, 0.16, 0.16],
      e.cases.map((c) => ({
        cells: [
          `${c.location}${c.governing ? ' (governs)' : ''}`,
          c.equation,
          c.I,
          c.t,
          c.tm,
          c.orderedWall,
          ...(external ? [c.allowablePressure] : []),
        ],
        strong: c.governing,
      })),
    );
  }

  if (e.preBend) {
    w.heading('Wall before bending', 10);
    w.rows(e.preBend, false);
  }

  if (e.messages.length > 0) {
    w.heading('Notes', 10);
    for (const m of e.messages)
      w.text(`${m.level === 'info' ? 'note' : m.level}: ${m.text}`, {
        size: 8.5,
        color:
          m.level === 'error' ? COLORS.fail : m.level === 'warning' ? COLORS.warn : COLORS.text,
      });
  }

  w.heading('Equation trail', 10);
  for (const g of e.trail) {
    w.ensure(48);
    w.text(g.title, {
      font: SEMIBOLD,
      size: 9,
      color: g.governing ? COLORS.accent : COLORS.ink,
      gap: 1,
    });
    for (const s of g.steps) {
      const block =
        w.height(`${s.label} [${s.equation}]`, w.width - 12, SEMIBOLD, 8.5) +
        w.height(s.formula, w.width - 12, REGULAR, 8.5) +
        w.height(s.substituted, w.width - 12, REGULAR, 8.5) +
        w.height(s.result, w.width - 12, SEMIBOLD, 8.5) +
        10;
      w.ensure(block);
      const x = w.left + 10;
      const width = w.width - 12;
      w.text(`${s.label}  [${s.equation}]`, {
        x,
        width,
        font: SEMIBOLD,
        size: 8.5,
        color: COLORS.text,
        gap: 0,
      });
      w.text(s.formula, { x, width, size: 8.5, color: COLORS.muted, gap: 0 });
      w.text(s.substituted, { x, width, size: 8.5, color: COLORS.text, gap: 0 });
      w.text(s.result, { x, width, font: SEMIBOLD, size: 8.5, color: COLORS.ink, gap: 4 });
    }
  }

  w.heading('Inputs and their sources', 10);
  w.table(
    ['symbol', 'input', 'value', 'source'],
    [0.07, 0.25, 0.12, 0.56],
    e.inputs.map((i) => ({
      cells: [i.symbol, i.label, i.value, i.source],
      flag: i.fromMemory ? 'FROM MEMORY: verify' : undefined,
    })),
    7.5,
  );
}

/** Header, caution and page number on every page (after layout, when the page count is known). */
function writeFurniture(doc: Doc, sheet: CalcSheet): void {
  const range = doc.bufferedPageRange();
  for (let i = 0; i < range.count; i++) {
    doc.switchToPage(range.start + i);
    const { width, height } = doc.page;
    // Writing inside the margins must not start a new page.
    const savedBottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const inner = width - 2 * PAGE.margin;
    doc.font(REGULAR).fontSize(7.5).fillColor(COLORS.muted);
    doc.text(toPdfText(`Spoolwright calc sheet · ${sheet.runningHeader}`), PAGE.margin, 24, {
      width: inner,
      lineBreak: false,
      ellipsis: true,
    });
    doc
      .moveTo(PAGE.margin, 36)
      .lineTo(width - PAGE.margin, 36)
      .lineWidth(0.5)
      .strokeColor(COLORS.rule)
      .stroke();

    const top = height - PAGE.bottom + 14;
    doc
      .moveTo(PAGE.margin, top)
      .lineTo(width - PAGE.margin, top)
      .lineWidth(0.8)
      .strokeColor(COLORS.accent)
      .stroke();
    doc
      .font(SEMIBOLD)
      .fontSize(7.5)
      .fillColor(COLORS.accent)
      .text('Caution. ', PAGE.margin, top + 5, { continued: true });
    doc.font(REGULAR).fillColor(COLORS.text).text(toPdfText(sheet.caution), { width: inner });
    doc
      .font(REGULAR)
      .fontSize(7.5)
      .fillColor(COLORS.muted)
      .text(toPdfText(pageLabel(i + 1, range.count)), PAGE.margin, height - 26, {
        width: inner,
        align: 'right',
        lineBreak: false,
      });
    doc.page.margins.bottom = savedBottom;
  }
}

/** Render the calc sheet to PDF bytes. */
export function renderCalcSheetPdf(sheet: CalcSheet): Promise<Buffer> {
  const doc = new PDFDocument({
    size: PAGE.size,
    margins: { top: PAGE.top, bottom: PAGE.bottom, left: PAGE.margin, right: PAGE.margin },
    bufferPages: true,
    info: {
      Title: toPdfText(`Calc sheet ${sheet.spoolName} ${sheet.revisionLabel}`),
      Subject: toPdfText(sheet.title),
      Creator: 'Spoolwright',
      Producer: 'Spoolwright (pdfkit)',
    },
  });
  const fonts = loadFonts();
  doc.registerFont(REGULAR, fonts.regular);
  doc.registerFont(SEMIBOLD, fonts.semibold);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const w = new Writer(doc);
  doc.y = PAGE.top;
  writeCover(w, sheet);
  for (const e of sheet.elements) writeElement(w, e);
  writeFurniture(doc, sheet);
  doc.end();
  return done;
}
