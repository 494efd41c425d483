// A report (ReportDoc) as PDF with pdf-lib's standard Helvetica, landscape A4 so wide tables fit.
// Every page carries the report title, the ledger position and its page number; table headers repeat
// on each page a table runs onto. No clock: the time printed comes in with the document.
import { PDFDocument, rgb, StandardFonts } from "pdf-lib";
import type { PDFFont, PDFPage } from "pdf-lib";
import { toWinAnsi } from "@/lib/product/certificate-pdf";
import { cellText, headerLines, ledgerText, reportTime } from "@/lib/report/report";
import type { ReportColumn, ReportDoc, ReportTable, ReportValue } from "@/lib/report/report";

const PAGE_W = 841.89; // A4 landscape, points
const PAGE_H = 595.28;
const MARGIN = 36;
const BODY = 8;
const LINE = 10.5;
const INK = rgb(0.1, 0.1, 0.12);
const MUTED = rgb(0.38, 0.38, 0.42);
const WARN = rgb(0.6, 0.25, 0.05);
const WIDTH = PAGE_W - 2 * MARGIN;
const NUMERIC = new Set<ReportColumn["kind"]>(["mass", "pct", "count"]);

class Writer {
  page!: PDFPage;
  y = 0;
  pages: PDFPage[] = [];
  constructor(
    readonly pdf: PDFDocument,
    readonly font: PDFFont,
    readonly bold: PDFFont,
  ) {
    this.newPage();
  }

  newPage(): void {
    this.page = this.pdf.addPage([PAGE_W, PAGE_H]);
    this.pages.push(this.page);
    this.y = PAGE_H - MARGIN;
  }

  room(height: number): boolean {
    if (this.y - height >= MARGIN + 18) return false;
    this.newPage();
    return true;
  }

  fit(s: string, font: PDFFont, size: number, width: number): string {
    let t = toWinAnsi(s, font);
    if (font.widthOfTextAtSize(t, size) <= width) return t;
    while (t.length > 1 && font.widthOfTextAtSize(`${t}...`, size) > width) t = t.slice(0, -1);
    return `${t}...`;
  }

  /** Text wrapped to the width. */
  text(
    s: string,
    o: { size?: number; bold?: boolean; color?: ReturnType<typeof rgb>; x?: number; width?: number } = {},
  ): void {
    const font = o.bold ? this.bold : this.font;
    const size = o.size ?? BODY + 1;
    const width = o.width ?? WIDTH;
    for (const para of toWinAnsi(s, font).split("\n")) {
      let line = "";
      const flush = () => {
        this.room(size + 3);
        this.page.drawText(line, { x: o.x ?? MARGIN, y: this.y - size, size, font, color: o.color ?? INK });
        this.y -= size + 3;
        line = "";
      };
      for (const word of para.split(/\s+/).filter(Boolean)) {
        const next = line ? `${line} ${word}` : word;
        if (font.widthOfTextAtSize(next, size) > width && line) {
          flush();
          line = word;
        } else line = next;
      }
      if (line) flush();
    }
  }

  facts(items: ReadonlyArray<readonly [string, string]>): void {
    for (const [term, value] of items) {
      this.room(LINE);
      this.page.drawText(this.fit(term, this.bold, BODY + 1, 128), {
        x: MARGIN,
        y: this.y - BODY - 1,
        size: BODY + 1,
        font: this.bold,
        color: MUTED,
      });
      this.text(value, { x: MARGIN + 132, width: WIDTH - 132 });
    }
  }
}

function columnWidths(w: Writer, t: ReportTable, timeZone: string): number[] {
  const sample = [...t.rows.slice(0, 200), ...(t.total ? [t.total] : [])];
  const natural = t.columns.map((c, i) => {
    let max = w.bold.widthOfTextAtSize(toWinAnsi(headerText(c), w.bold), BODY);
    for (const r of sample)
      max = Math.max(
        max,
        w.font.widthOfTextAtSize(toWinAnsi(cellText(r[i] ?? null, c.kind, timeZone, true), w.font), BODY),
      );
    return Math.min(max + 8, 260);
  });
  const sum = natural.reduce((s, x) => s + x, 0);
  return sum <= WIDTH ? natural : natural.map((x) => (x * WIDTH) / sum);
}

function headerText(c: ReportColumn): string {
  return c.kind === "mass" ? `${c.header} (kg)` : c.kind === "pct" ? `${c.header} (%)` : c.header;
}

function drawRow(
  w: Writer,
  t: ReportTable,
  widths: readonly number[],
  row: readonly ReportValue[],
  timeZone: string,
  o: { bold?: boolean; header?: boolean },
): void {
  let x = MARGIN;
  t.columns.forEach((c, i) => {
    const width = widths[i] ?? 40;
    const font = o.bold || o.header ? w.bold : w.font;
    const raw = o.header ? headerText(c) : cellText(row[i] ?? null, c.kind, timeZone, true);
    const text = w.fit(raw, font, BODY, width - 6);
    const tw = font.widthOfTextAtSize(text, BODY);
    const right = NUMERIC.has(c.kind);
    w.page.drawText(text, {
      x: right ? x + width - 6 - tw : x,
      y: w.y - BODY,
      size: BODY,
      font,
      color: o.header ? MUTED : INK,
    });
    x += width;
  });
  w.y -= LINE;
}

function drawTable(w: Writer, t: ReportTable, timeZone: string): void {
  w.room(LINE * 4);
  w.y -= 6;
  w.text(t.heading, { size: 11, bold: true });
  if (t.rows.length === 0) {
    w.text(t.empty, { color: MUTED });
    return;
  }
  const widths = columnWidths(w, t, timeZone);
  const header = () => {
    drawRow(w, t, widths, [], timeZone, { header: true });
    w.page.drawLine({
      start: { x: MARGIN, y: w.y + 2 },
      end: { x: MARGIN + widths.reduce((s, x) => s + x, 0), y: w.y + 2 },
      thickness: 0.5,
      color: MUTED,
    });
  };
  header();
  for (const r of t.rows) {
    if (w.room(LINE)) header();
    drawRow(w, t, widths, r, timeZone, {});
  }
  if (t.total) {
    if (w.room(LINE)) header();
    w.page.drawLine({
      start: { x: MARGIN, y: w.y + 1 },
      end: { x: MARGIN + widths.reduce((s, x) => s + x, 0), y: w.y + 1 },
      thickness: 0.5,
      color: MUTED,
    });
    drawRow(w, t, widths, t.total, timeZone, { bold: true });
  }
}

/** The report as PDF bytes. */
export async function renderReportPdf(doc: ReportDoc): Promise<Uint8Array> {
  const pdf = await PDFDocument.create({ updateMetadata: false });
  pdf.setTitle(`${doc.title}: ${doc.subject}`);
  pdf.setSubject(ledgerText(doc.ledger));
  pdf.setCreator("Tracevat");
  pdf.setProducer("Tracevat");
  pdf.setCreationDate(doc.producedAt);
  pdf.setModificationDate(doc.producedAt);
  const w = new Writer(
    pdf,
    await pdf.embedFont(StandardFonts.Helvetica),
    await pdf.embedFont(StandardFonts.HelveticaBold),
  );
  w.text(doc.plant, { size: 10, color: MUTED });
  w.text(doc.title, { size: 17, bold: true });
  w.y -= 4;
  w.facts([...headerLines(doc), ...doc.facts]);
  for (const n of doc.notes) {
    w.y -= 3;
    w.text(n, { color: MUTED });
  }
  if (doc.cautions.length > 0) {
    w.y -= 4;
    w.text("Cautions", { size: 11, bold: true, color: WARN });
    for (const c of doc.cautions) w.text(`- ${c}`, { color: WARN });
  }
  for (const t of doc.tables) drawTable(w, t, doc.timeZone);
  const footer = `${doc.title}. ${doc.plant}. Produced ${reportTime(doc.producedAt, doc.timeZone)} by ${doc.producedBy}; ledger: ${ledgerText(doc.ledger)}.`;
  w.pages.forEach((page, i) => {
    const text = w.fit(`${footer}  Page ${i + 1} of ${w.pages.length}`, w.font, 7, WIDTH);
    page.drawText(text, { x: MARGIN, y: MARGIN - 16, size: 7, font: w.font, color: MUTED });
  });
  return pdf.save();
}
