// Renders a certificate of analysis (CertificateData) as a PDF with pdf-lib's standard Helvetica.
// No clock: the generation time printed and stored in the PDF comes in with the data.
import { degrees, PDFDocument, rgb, StandardFonts } from "pdf-lib";
import type { PDFFont, PDFPage } from "pdf-lib";
import type { CertificateData, CertificateRow } from "@/lib/product/certificate-data";

const PAGE_W = 595.28; // A4 in points
const PAGE_H = 841.89;
const MARGIN = 42;
const BODY = 9;
const LINE = 12;
const INK = rgb(0.1, 0.1, 0.12);
const MUTED = rgb(0.38, 0.38, 0.42);
const BAD = rgb(0.65, 0.1, 0.1);

/** Table columns: header, width (points). They add up to the printable width. */
const COLUMNS: ReadonlyArray<
  readonly [
    keyof Pick<CertificateRow, "property" | "method" | "limit" | "result" | "unit" | "verdictText">,
    string,
    number,
  ]
> = [
  ["property", "Property", 150],
  ["method", "Method", 82],
  ["limit", "Limit", 86],
  ["result", "Result", 58],
  ["unit", "Unit", 70],
  ["verdictText", "Verdict", 65],
];

const REPLACEMENTS: ReadonlyArray<readonly [RegExp, string]> = [
  // "≤ 0.2 % mass or …" → "0.2 % mass max or …": the word goes after the figure and its unit.
  [/≤\s*([^,;()]+?)(?=\s+or\s|[,;)]|$)/g, "$1 max"],
  [/≥\s*([^,;()]+?)(?=\s+or\s|[,;)]|$)/g, "$1 min"],
  [/[−–—‑]/g, "-"],
  [/[‘’]/g, "'"],
  [/[“”]/g, '"'],
  [/…/g, "..."],
  [/\u00a0|\u202f/g, " "],
];

/**
 * Standard PDF fonts encode WinAnsi only: signs like "≤" become words ("max"), dashes become "-", and
 * any other character the font cannot show becomes "?", so printing never fails on a typed character.
 */
export function toWinAnsi(text: string, font: Pick<PDFFont, "getCharacterSet">): string {
  let s = text;
  for (const [pattern, to] of REPLACEMENTS) s = s.replace(pattern, to);
  const known = new Set(font.getCharacterSet());
  return Array.from(s)
    .map((ch) => (ch === "\n" || known.has(ch.codePointAt(0) ?? -1) ? ch : "?"))
    .join("");
}

/** The date and time in the site's zone, e.g. "4 Dec 2026, 10:00". */
export function certificateTime(d: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", {
    timeZone,
    day: "numeric",
    month: "short",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hour12: false,
  }).format(d);
}

export function certificateDate(d: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", { timeZone, day: "numeric", month: "short", year: "numeric" }).format(d);
}

/** Splits text into lines that fit the width at the size (words longer than a line are cut). */
function wrap(text: string, font: PDFFont, size: number, width: number): string[] {
  const lines: string[] = [];
  for (const para of text.split("\n")) {
    let line = "";
    for (const word of para.split(/\s+/).filter(Boolean)) {
      const next = line ? `${line} ${word}` : word;
      if (font.widthOfTextAtSize(next, size) <= width) {
        line = next;
        continue;
      }
      if (line) lines.push(line);
      let rest = word;
      while (font.widthOfTextAtSize(rest, size) > width && rest.length > 1) {
        let cut = rest.length - 1;
        while (cut > 1 && font.widthOfTextAtSize(rest.slice(0, cut), size) > width) cut--;
        lines.push(rest.slice(0, cut));
        rest = rest.slice(cut);
      }
      line = rest;
    }
    lines.push(line);
  }
  return lines;
}

class Writer {
  page!: PDFPage;
  y = 0;
  pages: PDFPage[] = [];
  constructor(
    readonly doc: PDFDocument,
    readonly font: PDFFont,
    readonly bold: PDFFont,
    readonly data: CertificateData,
  ) {
    this.newPage();
  }

  newPage(): void {
    this.page = this.doc.addPage([PAGE_W, PAGE_H]);
    this.pages.push(this.page);
    this.y = PAGE_H - MARGIN;
    if (!this.data.released) {
      this.page.drawText("NOT RELEASED", {
        x: 120,
        y: 260,
        size: 72,
        font: this.bold,
        color: BAD,
        opacity: 0.16,
        rotate: degrees(40),
      });
    }
  }

  room(height: number): void {
    if (this.y - height < MARGIN + 30) this.newPage();
  }

  text(
    s: string,
    o: { x?: number; size?: number; bold?: boolean; color?: ReturnType<typeof rgb>; width?: number } = {},
  ): void {
    const font = o.bold ? this.bold : this.font;
    const size = o.size ?? BODY;
    for (const line of wrap(toWinAnsi(s, font), font, size, o.width ?? PAGE_W - 2 * MARGIN)) {
      this.room(size + 3);
      this.page.drawText(line, { x: o.x ?? MARGIN, y: this.y - size, size, font, color: o.color ?? INK });
      this.y -= size + 3;
    }
  }

  gap(h: number): void {
    this.y -= h;
  }

  rule(): void {
    this.page.drawLine({
      start: { x: MARGIN, y: this.y },
      end: { x: PAGE_W - MARGIN, y: this.y },
      thickness: 0.6,
      color: MUTED,
    });
    this.gap(4);
  }

  facts(items: ReadonlyArray<readonly [string, string]>): void {
    for (const [term, value] of items) {
      const lines = wrap(toWinAnsi(value, this.font), this.font, BODY, PAGE_W - 2 * MARGIN - 120);
      this.room(lines.length * LINE);
      this.page.drawText(toWinAnsi(term, this.bold), {
        x: MARGIN,
        y: this.y - BODY,
        size: BODY,
        font: this.bold,
        color: MUTED,
      });
      for (const line of lines) {
        this.page.drawText(line, { x: MARGIN + 120, y: this.y - BODY, size: BODY, font: this.font, color: INK });
        this.y -= LINE;
      }
    }
  }

  tableHeader(): void {
    this.room(LINE * 2);
    let x = MARGIN;
    for (const [, header, width] of COLUMNS) {
      this.page.drawText(header, { x, y: this.y - BODY, size: BODY, font: this.bold, color: MUTED });
      x += width;
    }
    this.y -= LINE;
    this.rule();
  }

  tableRow(row: CertificateRow): void {
    const cells = COLUMNS.map(([key, , width]) =>
      wrap(toWinAnsi(row[key] || (key === "result" ? "-" : ""), this.font), this.font, BODY, width - 6),
    );
    const height = Math.max(...cells.map((c) => c.length)) * LINE;
    if (this.y - height < MARGIN + 30) {
      this.newPage();
      this.tableHeader();
    }
    let x = MARGIN;
    COLUMNS.forEach(([key, , width], i) => {
      const font = key === "verdictText" ? this.bold : this.font;
      const color = key === "verdictText" && (row.verdict === "FAIL" || row.verdict === "MISSING") ? BAD : INK;
      cells[i]!.forEach((line, j) =>
        this.page.drawText(line, { x, y: this.y - BODY - j * LINE, size: BODY, font, color }),
      );
      x += width;
    });
    this.y -= height + 2;
  }
}

function decisionLines(d: CertificateData): Array<readonly [string, string]> {
  const tz = d.timeZone;
  const out: Array<readonly [string, string]> = [["Decision", d.decision.statusText]];
  if (d.decision.by) out.push(["Decided by", d.decision.by]);
  if (d.decision.at) out.push(["Decided", certificateTime(d.decision.at, tz)]);
  if (d.decision.deviation) out.push(["Deviation accepted", d.decision.reason]);
  else if (d.decision.reason) out.push(["Reason", d.decision.reason]);
  return out;
}

/** The certificate as PDF bytes. */
export async function renderCertificatePdf(d: CertificateData): Promise<Uint8Array> {
  const doc = await PDFDocument.create({ updateMetadata: false });
  doc.setTitle(`Certificate of analysis, product lot ${d.lot.code}`);
  doc.setSubject(d.specText);
  doc.setCreator("Tracevat");
  doc.setProducer("Tracevat");
  doc.setCreationDate(d.generatedAt);
  doc.setModificationDate(d.generatedAt);
  const w = new Writer(
    doc,
    await doc.embedFont(StandardFonts.Helvetica),
    await doc.embedFont(StandardFonts.HelveticaBold),
    d,
  );
  const tz = d.timeZone;

  w.text(`${d.plant.name}, ${d.plant.town}`, { size: 10, color: MUTED });
  w.gap(4);
  w.text("Certificate of analysis", { size: 18, bold: true });
  if (!d.released)
    w.text("Not released: this sheet is for review and is not a certificate.", { bold: true, color: BAD });
  w.gap(8);
  w.facts([
    ["Product lot", d.lot.code],
    ["Batch", d.lot.batchCode ?? "-"],
    ["Produced", certificateDate(d.lot.producedAt, tz)],
    ["Quantity", `${d.lot.massKg.toLocaleString("en", { maximumFractionDigits: 1 })} kg`],
    ["Specification", d.specText],
  ]);
  w.gap(10);
  w.text("Results", { size: 11, bold: true });
  w.gap(2);
  w.tableHeader();
  for (const row of d.rows) w.tableRow(row);
  if (d.rules.length > 0) {
    w.gap(8);
    w.text("Either-or requirements", { size: 11, bold: true });
    for (const r of d.rules)
      w.text(`${r.label}: ${r.met ? "met" : "NOT met"} (${r.text})`, { color: r.met ? INK : BAD });
  }
  if (d.missing.length > 0) {
    w.gap(6);
    w.text(`Required results missing: ${d.missing.join(", ")}`, { color: BAD });
  }
  w.gap(10);
  w.text("Release", { size: 11, bold: true });
  w.gap(2);
  w.facts(decisionLines(d));

  const footer = `Generated ${certificateTime(d.generatedAt, tz)} (${tz}) from the plant's records. Product lot ${d.lot.code}.`;
  w.pages.forEach((page, i) => {
    const text = toWinAnsi(`${footer}  Page ${i + 1} of ${w.pages.length}`, w.font);
    page.drawText(text, { x: MARGIN, y: MARGIN - 14, size: 7.5, font: w.font, color: MUTED });
  });
  return doc.save();
}
