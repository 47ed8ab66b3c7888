// Renders a report definition (reports/*.report.json) with its data to a PDF, with pdfkit and the
// Public Sans files the web app ships (@fontsource). pdfkit embeds TrueType, OpenType, WOFF and
// WOFF2; we embed WOFF because a WOFF2 file of this family lost glyphs in the subset pdfkit wrote
// (an "e" went missing in a trial), while WOFF kept every one (render-pdf.spec.ts checks the text).
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';
import PDFDocument from 'pdfkit';
import { fill, present, valueAt, type ReportDefinition, type ReportSection } from './report-definition.js';

const require = createRequire(import.meta.url);
const fontFile = (subset: 'latin' | 'latin-ext', weight: 400 | 700) =>
  require.resolve(`@fontsource/public-sans/files/public-sans-${subset}-${weight}-normal.woff`);

interface FontFace {
  name: string;
  data: Buffer;
  has: (cp: number) => boolean;
}

/** The four faces, read once: Latin first, Latin Extended for the names Latin lacks (ł, ő, ş …). */
const FACES = (() => {
  const load = (name: string, subset: 'latin' | 'latin-ext', weight: 400 | 700): FontFace => {
    const data = readFileSync(fontFile(subset, weight));
    const font = fontkit.create(data) as fontkit.Font;
    return { name, data, has: (cp) => font.hasGlyphForCodePoint(cp) };
  };
  return {
    regular: [load('Sans', 'latin', 400), load('SansExt', 'latin-ext', 400)],
    bold: [load('Sans-Bold', 'latin', 700), load('SansExt-Bold', 'latin-ext', 700)],
  };
})();

// design.md §9: ink blue for structure (headings, table rules), paper for fills, copper sparingly.
const INK = '#1f2a44';
const TEXT = '#1b1b1b';
const MUTED = '#4a4f5c';
const PAPER = '#faf7f0';
const RULE = '#c9c3b4';

const MARGIN = 50;

/** Splits text into runs, each in the first face that has all its characters. */
function runs(text: string, bold: boolean): { face: string; text: string }[] {
  const faces = bold ? FACES.bold : FACES.regular;
  const out: { face: string; text: string }[] = [];
  for (const ch of text) {
    const cp = ch.codePointAt(0)!;
    const face = (cp <= 0x20 ? faces[0] : faces.find((f) => f.has(cp)) ?? faces[0])!.name;
    const last = out[out.length - 1];
    if (last && (last.face === face || cp <= 0x20)) last.text += ch;
    else out.push({ face, text: ch });
  }
  return out.length ? out : [{ face: faces[0]!.name, text: '' }];
}

type Doc = PDFKit.PDFDocument;

interface TextOptions {
  bold?: boolean;
  size: number;
  color?: string;
  width: number;
  align?: 'left' | 'right';
  x?: number;
  y?: number;
}

function write(doc: Doc, text: string, o: TextOptions): void {
  const parts = runs(text, o.bold ?? false);
  doc.fillColor(o.color ?? TEXT).fontSize(o.size);
  parts.forEach((p, i) => {
    doc.font(p.face);
    const opts = { width: o.width, align: o.align ?? 'left', continued: i < parts.length - 1, lineGap: 1.5 };
    if (i === 0 && o.x !== undefined) doc.text(p.text, o.x, o.y ?? doc.y, opts);
    else doc.text(p.text, opts);
  });
}

function heightOf(doc: Doc, text: string, o: TextOptions): number {
  doc.font(runs(text, o.bold ?? false)[0]!.face).fontSize(o.size);
  return doc.heightOfString(text || ' ', { width: o.width, lineGap: 1.5 });
}

const bottom = (doc: Doc) => doc.page.height - MARGIN - 20;
function ensureSpace(doc: Doc, h: number): void {
  if (doc.y + h > bottom(doc)) doc.addPage();
}

function renderSections(doc: Doc, sections: readonly ReportSection[], data: unknown, root: unknown): void {
  const width = doc.page.width - 2 * MARGIN;
  for (const s of sections) {
    if (s.when && !present(valueAt(data, s.when) ?? valueAt(root, s.when))) continue;
    const f = (t: string) => fill(t, data);
    switch (s.type) {
      case 'heading': {
        const size = s.level === 1 ? 18 : 12.5;
        const t = f(s.text);
        ensureSpace(doc, heightOf(doc, t, { size, bold: true, width }) + 30);
        doc.moveDown(s.level === 1 ? 0 : 0.6);
        write(doc, t, { size, bold: true, color: INK, width, x: MARGIN });
        if (s.level === 1) {
          doc.moveTo(MARGIN, doc.y + 2).lineTo(MARGIN + width, doc.y + 2).lineWidth(1.2).strokeColor(INK).stroke();
          doc.moveDown(0.5);
        } else doc.moveDown(0.2);
        break;
      }
      case 'paragraph': {
        const size = s.style === 'lead' ? 12 : s.style === 'small' ? 8.5 : 10;
        const t = f(s.text);
        ensureSpace(doc, heightOf(doc, t, { size, width }));
        write(doc, t, { size, width, x: MARGIN, color: s.style === 'small' ? MUTED : TEXT });
        doc.moveDown(0.4);
        break;
      }
      case 'fields': {
        // Two label-value pairs per line: label in small ink capitals, value below it.
        const colW = width / 2;
        for (let i = 0; i < s.fields.length; i += 2) {
          const pair = s.fields.slice(i, i + 2).map((fl) => ({ label: fl.label, value: f(fl.value) || '—' }));
          const h = Math.max(...pair.map((p) => heightOf(doc, p.value, { size: 10.5, width: colW - 12 }))) + 14;
          ensureSpace(doc, h);
          const y = doc.y;
          pair.forEach((p, j) => {
            const x = MARGIN + j * colW;
            write(doc, p.label.toUpperCase(), { size: 7.5, bold: true, color: INK, width: colW - 12, x, y });
            write(doc, p.value, { size: 10.5, width: colW - 12, x, y: y + 11 });
          });
          doc.y = y + h + 2;
        }
        doc.x = MARGIN;
        doc.moveDown(0.3);
        break;
      }
      case 'table': {
        const rows = (valueAt(data, s.rows) ?? valueAt(root, s.rows)) as unknown[] | undefined;
        if (s.title) {
          ensureSpace(doc, 60);
          doc.moveDown(0.4);
          write(doc, f(s.title), { size: 11.5, bold: true, color: INK, width, x: MARGIN });
          doc.moveDown(0.2);
        }
        const list = Array.isArray(rows) ? rows : [];
        const cols = s.columns.map((c) => ({ ...c, w: c.width * width }));
        const header = () => {
          const y = doc.y;
          doc.rect(MARGIN, y, width, 16).fill(PAPER);
          let x = MARGIN;
          for (const c of cols) {
            write(doc, c.header, { size: 8, bold: true, color: INK, width: c.w - 8, x: x + 4, y: y + 4, align: c.align });
            x += c.w;
          }
          doc.moveTo(MARGIN, y + 16).lineTo(MARGIN + width, y + 16).lineWidth(0.8).strokeColor(INK).stroke();
          doc.y = y + 19;
        };
        if (list.length === 0) {
          if (s.empty) {
            write(doc, fill(s.empty, data), { size: 9.5, color: MUTED, width, x: MARGIN });
            doc.moveDown(0.4);
          }
          break;
        }
        ensureSpace(doc, 40);
        header();
        for (const row of list) {
          const cells = cols.map((c) => fill(c.value, row));
          const h = Math.max(...cells.map((t, i) => heightOf(doc, t, { size: 9.5, width: cols[i]!.w - 8 }))) + 6;
          if (doc.y + h > bottom(doc)) {
            doc.addPage();
            header();
          }
          const y = doc.y;
          let x = MARGIN;
          cells.forEach((t, i) => {
            write(doc, t, { size: 9.5, width: cols[i]!.w - 8, x: x + 4, y: y + 3, align: cols[i]!.align });
            x += cols[i]!.w;
          });
          doc.moveTo(MARGIN, y + h).lineTo(MARGIN + width, y + h).lineWidth(0.4).strokeColor(RULE).stroke();
          doc.y = y + h + 1;
        }
        doc.x = MARGIN;
        doc.moveDown(0.5);
        break;
      }
      case 'list': {
        const items = valueAt(data, s.items) as unknown[] | undefined;
        if (!Array.isArray(items) || items.length === 0) {
          if (s.empty) write(doc, fill(s.empty, data), { size: 10, color: MUTED, width, x: MARGIN });
          doc.moveDown(0.4);
          break;
        }
        for (const item of items) {
          const t = fill(s.text, item);
          ensureSpace(doc, heightOf(doc, t, { size: 10, width: width - 14 }));
          const y = doc.y;
          write(doc, '•', { size: 10, color: INK, width: 10, x: MARGIN, y });
          write(doc, t, { size: 10, width: width - 14, x: MARGIN + 14, y });
          doc.moveDown(0.25);
        }
        doc.x = MARGIN;
        doc.moveDown(0.3);
        break;
      }
      case 'note': {
        const t = f(s.text);
        const h = heightOf(doc, t, { size: 9, width: width - 20 }) + 14;
        ensureSpace(doc, h + 10);
        doc.moveDown(0.4);
        const y = doc.y;
        doc.rect(MARGIN, y, width, h).lineWidth(0.8).fillAndStroke(PAPER, INK);
        write(doc, t, { size: 9, width: width - 20, x: MARGIN + 10, y: y + 7 });
        doc.y = y + h + 6;
        doc.x = MARGIN;
        break;
      }
      case 'bars': {
        const items = valueAt(data, s.items) as unknown[] | undefined;
        if (!Array.isArray(items) || items.length === 0) {
          if (s.empty) write(doc, fill(s.empty, data), { size: 10, color: MUTED, width, x: MARGIN });
          doc.moveDown(0.4);
          break;
        }
        const values = items.map((i) => Number(valueAt(i, s.value)) || 0);
        const max = Math.max(1, ...values);
        const labelW = 120;
        const textW = 90;
        const barW = width - labelW - textW - 10;
        items.forEach((item, i) => {
          ensureSpace(doc, 18);
          const y = doc.y;
          write(doc, fill(s.label, item), { size: 9.5, width: labelW - 6, x: MARGIN, y: y + 2 });
          const w = (values[i]! / max) * barW;
          doc.rect(MARGIN + labelW, y + 2, barW, 11).lineWidth(0.5).stroke(RULE);
          if (w > 0) doc.rect(MARGIN + labelW, y + 2, w, 11).fill(INK);
          write(doc, fill(s.text, item), { size: 9.5, width: textW, x: MARGIN + labelW + barW + 8, y: y + 2 });
          doc.y = y + 17;
        });
        doc.x = MARGIN;
        doc.moveDown(0.4);
        break;
      }
      case 'repeat': {
        const items = valueAt(data, s.items) as unknown[] | undefined;
        for (const item of Array.isArray(items) ? items : []) renderSections(doc, s.sections, item, root);
        break;
      }
    }
  }
}

/** The PDF of one report, as bytes. */
export function renderReport(definition: ReportDefinition, data: Record<string, unknown>): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: MARGIN, bottom: MARGIN, left: MARGIN, right: MARGIN },
    bufferPages: true,
    info: { Title: fill(`${definition.title}`, data), Creator: 'Stavemark', Producer: 'Stavemark' },
  });
  for (const face of [...FACES.regular, ...FACES.bold]) doc.registerFont(face.name, face.data);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((res, rej) => {
    doc.on('end', () => res(Buffer.concat(chunks)));
    doc.on('error', rej);
  });
  renderSections(doc, definition.sections, data, data);

  // Footer on every page: what this is, for whom, and page n of m.
  const range = doc.bufferedPageRange();
  const footer = definition.footer ? fill(definition.footer, data) : definition.title;
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const keep = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    const y = doc.page.height - MARGIN + 12;
    const width = doc.page.width - 2 * MARGIN;
    write(doc, footer, { size: 7.5, color: MUTED, width: width - 80, x: MARGIN, y });
    write(doc, `Page ${i - range.start + 1} of ${range.count}`, { size: 7.5, color: MUTED, width: 80, x: MARGIN + width - 80, y, align: 'right' });
    doc.page.margins.bottom = keep;
  }
  doc.end();
  return done;
}
