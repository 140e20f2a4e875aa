import 'server-only';
import PDFDocument from 'pdfkit';
import { MEASURE } from '@/lib/glossary';
import { REPORT_CAUTION, REPORT_TONE } from './labels';
import { DECISION_STATUS, VERDICT_STATUS, type Shape, type StatusLook } from '@/lib/status';
import { sessionDetails, takeCells } from './content';
import type { ReportData } from './content';
import { formatDateTime } from '@/lib/format';

// The PDF uses the built-in Helvetica, whose encoding is Windows-1252: other characters are
// spelled out or simplified so nothing turns into garbage.
const WIN_ANSI_EXTRA = '€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ';
const REPLACE: Record<string, string> = { '−': '-', '‐': '-', '‑': '-', '≤': '<=', '≥': '>=', 'Ł': 'L', 'ł': 'l', 'Đ': 'D', 'đ': 'd', 'ı': 'i', ...Object.fromEntries([...Object.values(VERDICT_STATUS), ...Object.values(DECISION_STATUS)].map((status) => [status.mark, ''])) };

export function pdfText(text: string): string {
  let out = '';
  for (const ch of text) {
    const code = ch.codePointAt(0)!;
    if ((code >= 0x20 && code <= 0x7e) || (code >= 0xa0 && code <= 0xff) || WIN_ANSI_EXTRA.includes(ch)) out += ch;
    else if (ch in REPLACE) out += REPLACE[ch];
    else if (ch === '\n' || ch === '\t') out += ' ';
    else {
      const plain = ch.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
      out += [...plain].every((c) => c.codePointAt(0)! < 0x7f) && plain ? plain : '?';
    }
  }
  return out;
}

const INK = '#1b2430';
const MUTED = '#505a68';
const LINE = '#cfc9bd';
/** Draws a verdict's or decision's shape (8 pt), so status never depends on colour (Helvetica has no glyphs for them). */
function shape(doc: PDFKit.PDFDocument, kind: Shape, x: number, y: number, color: string) {
  doc.save().lineWidth(1.4).strokeColor(color).fillColor(color);
  if (kind === 'check') doc.moveTo(x, y + 4).lineTo(x + 3, y + 7.5).lineTo(x + 8, y).stroke();
  else if (kind === 'triangle') doc.polygon([x + 4, y], [x + 8, y + 7.5], [x, y + 7.5]).fill();
  else if (kind === 'cross') doc.moveTo(x, y).lineTo(x + 7.5, y + 7.5).moveTo(x + 7.5, y).lineTo(x, y + 7.5).stroke();
  else if (kind === 'dot') doc.circle(x + 4, y + 4, 3.4).fill();
  else if (kind === 'square') doc.rect(x + 0.5, y + 0.5, 7, 7).fill();
  else if (kind === 'dottedRing') doc.circle(x + 4, y + 4, 3.4).dash(1, { space: 1.2 }).stroke().undash();
  else if (kind === 'ring') doc.circle(x + 4, y + 4, 3.4).stroke();
  else throw new Error(`The PDF draws no ${kind} shape`);
  doc.restore();
}

const COLUMNS = [
  { key: 'name', title: 'Take', width: 178 },
  { key: 'format', title: 'Format', width: 118 },
  { key: 'verdict', title: 'Verdict', width: 92 },
  { key: 'decision', title: 'Decision', width: 78 },
  { key: 'truePeak', title: MEASURE.truePeak.label, width: 62 },
  { key: 'loudness', title: MEASURE.integratedLoudness.label, width: 62 },
  { key: 'noiseFloor', title: MEASURE.noiseFloor.label, width: 62 },
  { key: 'effectiveBits', title: MEASURE.effectiveBits.label, width: 48 },
  { key: 'clips', title: MEASURE.clipEvents.label, width: 62 },
] as const;

/** The session report as an A4 landscape PDF: details, summary, the take table, the caution. */
export function reportPdf(data: ReportData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    layout: 'landscape',
    margins: { top: 40, bottom: 40, left: 40, right: 40 },
    info: { Title: pdfText(`${data.session.title} - session report`), Author: pdfText(data.studio), Creator: 'Takeproof' },
    bufferPages: true,
  });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;
  const bottom = () => doc.page.height - doc.page.margins.bottom - 30;

  doc.font('Helvetica').fontSize(10).fillColor(MUTED).text(pdfText(`${data.studio} · Session report`), left, 40);
  doc.font('Helvetica-Bold').fontSize(18).fillColor(INK).text(pdfText(data.session.title), { width });
  doc.moveDown(0.5);

  // Session details in two columns of label: value.
  const details = sessionDetails(data);
  const half = Math.ceil(details.length / 2);
  const top = doc.y;
  let maxY = top;
  details.forEach(([k, v], i) => {
    const x = left + (i < half ? 0 : width / 2);
    const y = top + (i % half) * 15;
    doc.font('Helvetica').fontSize(10).fillColor(MUTED).text(pdfText(`${k}:`), x, y, { width: 90 });
    doc.font('Helvetica').fillColor(INK).text(pdfText(v), x + 92, y, { width: width / 2 - 100, lineBreak: false, ellipsis: true });
    maxY = Math.max(maxY, y + 15);
  });
  doc.y = maxY + 8;

  // Summary: counts by verdict and by decision, each with its shape and word.
  doc.font('Helvetica-Bold').fontSize(12).fillColor(INK).text('Summary', left, doc.y);
  const summaryRow = (label: string, items: { status: StatusLook; n: number }[]) => {
    const y = doc.y + 4;
    doc.font('Helvetica').fontSize(10).fillColor(MUTED).text(label, left, y, { lineBreak: false });
    let x = left + 70;
    for (const it of items) {
      shape(doc, it.status.shape, x, y + 1, REPORT_TONE[it.status.tone]);
      const t = `${it.status.word} ${it.n}`;
      doc.fillColor(INK).text(t, x + 12, y, { lineBreak: false });
      x += 12 + doc.widthOfString(t) + 18;
    }
    doc.y = y + 14;
  };
  const v = data.counts.verdict;
  const d = data.counts.decision;
  summaryRow('Verdicts', [
    { status: VERDICT_STATUS.fail, n: v.fail },
    { status: VERDICT_STATUS.warn, n: v.warn },
    { status: VERDICT_STATUS.pass, n: v.pass },
    ...(v.none ? [{ status: VERDICT_STATUS.none, n: v.none }] : []),
  ]);
  summaryRow('Decisions', [
    { status: DECISION_STATUS.approved, n: d.approved },
    { status: DECISION_STATUS.rejected, n: d.rejected },
    { status: DECISION_STATUS.pending, n: d.pending },
  ]);
  doc.moveDown(0.8);

  // The take table.
  const header = () => {
    const y = doc.y;
    let x = left;
    doc.font('Helvetica-Bold').fontSize(9).fillColor(INK);
    // Headings wrap onto a second line where the column is narrower than the glossary's name.
    const headingHeight = Math.max(...COLUMNS.map((c) => doc.heightOfString(c.title, { width: c.width - 6 })));
    for (const c of COLUMNS) {
      doc.text(c.title, x + 3, y, { width: c.width - 6 });
      x += c.width;
    }
    doc.moveTo(left, y + headingHeight + 2).lineTo(left + width, y + headingHeight + 2).lineWidth(1).strokeColor(INK).stroke();
    doc.y = y + headingHeight + 6;
  };
  doc.font('Helvetica-Bold').fontSize(12).fillColor(INK).text('Takes', left, doc.y);
  doc.moveDown(0.3);
  if (data.takes.length === 0) {
    doc.font('Helvetica').fontSize(10).text('No takes have been uploaded to this session yet.', left, doc.y);
  } else {
    header();
    for (const take of data.takes) {
      const c = takeCells(take);
      const name = pdfText(c.name);
      const notes = [c.problem, c.note].filter(Boolean).join(' · ');
      const note = pdfText([c.reason ? `Reason: ${c.reason}` : null, notes ? `Note: ${notes}` : null].filter(Boolean).join('   '));
      doc.font('Helvetica').fontSize(9);
      const nameH = doc.heightOfString(name, { width: COLUMNS[0].width - 6 });
      const noteH = note ? doc.heightOfString(note, { width: width - 6 }) + 3 : 0;
      const rowH = Math.max(12, nameH) + noteH + 6;
      if (doc.y + rowH > bottom()) {
        doc.addPage();
        doc.y = doc.page.margins.top;
        header();
      }
      const y = doc.y;
      let x = left;
      for (const col of COLUMNS) {
        const w = col.width - 6;
        if (col.key === 'verdict') {
          shape(doc, c.verdict.shape, x + 3, y + 1, REPORT_TONE[c.verdict.tone]);
          doc.fillColor(REPORT_TONE[c.verdict.tone]).font('Helvetica-Bold').text(c.verdict.word, x + 15, y, { width: w - 12, lineBreak: false });
        } else if (col.key === 'decision') {
          shape(doc, c.decision.shape, x + 3, y + 1, REPORT_TONE[c.decision.tone]);
          doc.fillColor(REPORT_TONE[c.decision.tone]).font('Helvetica-Bold').text(c.decision.word, x + 15, y, { width: w - 12, lineBreak: false });
        } else if (col.key === 'name') {
          doc.fillColor(INK).font('Helvetica').text(name, x + 3, y, { width: w });
        } else {
          doc.fillColor(INK).font('Helvetica').text(pdfText(c[col.key]), x + 3, y, { width: w, lineBreak: false, ellipsis: true });
        }
        x += col.width;
      }
      let rowBottom = y + Math.max(12, nameH);
      if (note) {
        doc.font('Helvetica').fontSize(9).fillColor(INK).text(note, left + 3, rowBottom + 2, { width: width - 6 });
        rowBottom += noteH;
      }
      doc.moveTo(left, rowBottom + 3).lineTo(left + width, rowBottom + 3).lineWidth(0.5).strokeColor(LINE).stroke();
      doc.y = rowBottom + 6;
    }
  }

  // Caution and page numbers on every page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = doc.page.height - doc.page.margins.bottom - 24;
    doc.font('Helvetica').fontSize(8).fillColor(MUTED);
    doc.text(pdfText(REPORT_CAUTION), left, y, { width: width - 80, lineBreak: true, height: 24 });
    doc.text(`Page ${i + 1} of ${range.count}`, left + width - 70, y, { width: 70, align: 'right', lineBreak: false });
    doc.text(`Generated ${formatDateTime(data.generatedAt)}`, left + width - 200, y + 10, { width: 200, align: 'right', lineBreak: false });
  }
  doc.end();
  return done;
}
