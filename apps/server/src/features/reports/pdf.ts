// The repair report as a PDF for the customer (pdfkit), drawn from the one report model (service.ts). The lines
// are composed first and drawn second, so what the PDF says can be checked without parsing a PDF.
import PDFDocument from 'pdfkit';
import { jobStatusLabels, METER_WORDS, shopCardLines, type RepairReport, type ReportReading } from '@splitscope/contract';

type Line = { style: 'title' | 'shop' | 'subtitle' | 'heading' | 'field' | 'text' | 'caution'; text: string; label?: string; gapAfter?: number };

const VERDICT_WORDS = { ok: 'healthy', low: 'low', high: 'high' } as const;

const readingLine = (r: ReportReading): Line => ({
  style: 'text',
  text: `• ${r.probes} (${METER_WORDS[r.mode]}, ${r.boardState}): ${r.mode === 'continuity' ? ((r.beep ?? r.value !== 'OL') ? 'beep' : 'no beep') : r.value === 'OL' ? 'OL' : r.raw}${r.verdict ? ` (${VERDICT_WORDS[r.verdict.verdict]})` : ''}`,
});

/** What the PDF says, line by line. */
export function reportLines(r: RepairReport): Line[] {
  const field = (label: string, value: string | null): Line[] => (value ? [{ style: 'field', label, text: value }] : []);
  const finding = r.finding.part
    ? `Faulty part: ${r.finding.part}${r.finding.reviewedBy ? ` (diagnosis reviewed by ${r.finding.reviewedBy})` : ''}`
    : 'No finding recorded.';
  return [
    { style: 'title', text: r.shop.name },
    ...shopCardLines(r.shop).map((text): Line => ({ style: 'shop', text })),
    { style: 'subtitle', text: `Repair report: job ${r.jobNumber}`, gapAfter: 1 },
    ...field('Customer', r.customer.company ? `${r.customer.name} (${r.customer.company})` : r.customer.name),
    ...field('Unit', r.unit),
    ...field('Board', `${r.board} (board model version ${r.boardVersion})`),
    ...field('Serial', r.serial),
    ...field('Fault code', r.faultCode),
    ...field('Reported symptom', r.symptom),
    ...field('Received', r.receivedAt.slice(0, 10)),
    ...field('Status', jobStatusLabels[r.status]),
    { style: 'heading', text: 'Finding' },
    { style: 'text', text: finding },
    { style: 'heading', text: 'Work done' },
    ...(r.repairs.length
      ? r.repairs.map((a): Line => ({
          style: 'text',
          text: `• ${a.part}: ${a.action}${a.replacementValue ? `, new part ${a.replacementValue}` : ''}${a.notes ? `. ${a.notes}` : ''}`,
        }))
      : [{ style: 'text' as const, text: 'No repair actions recorded.' }]),
    { style: 'heading', text: 'Verification readings' },
    ...(r.verification.length ? r.verification.map(readingLine) : [{ style: 'text' as const, text: 'No verification readings recorded.' }]),
    {
      style: 'caution',
      text: 'Mains wiring and the DC bus of these boards are dangerous. Have the board installed by a qualified technician, under your local electrical codes.',
    },
  ];
}

/** The logo's box at the head of the page, pt (about 53 × 18 mm). */
const LOGO_FIT: [number, number] = [150, 50];

/** Renders the report, headed by the shop's logo when it has one (PNG or JPEG bytes); resolves with the PDF bytes. */
export function renderReportPdf(r: RepairReport, logo?: Buffer | null): Promise<Buffer> {
  const doc = new PDFDocument({ size: 'A4', margin: 50, info: { Title: `Repair report, job ${r.jobNumber}`, Author: r.shop.name } });
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  if (logo) doc.image(logo, { fit: LOGO_FIT }).moveDown(0.5);
  let previous: Line['style'] | undefined;
  for (const line of reportLines(r)) {
    if (line.style === 'heading' && previous !== 'subtitle') doc.moveDown();
    if (line.style === 'caution') doc.moveDown(2);
    if (line.style === 'title') doc.fontSize(18).text(line.text);
    else if (line.style === 'shop') doc.fontSize(9).fillColor('#555').text(line.text).fillColor('black');
    else if (line.style === 'subtitle')
      doc
        .moveDown(previous === 'shop' ? 0.5 : 0)
        .fontSize(14)
        .text(line.text);
    else if (line.style === 'heading') doc.fontSize(12).font('Helvetica-Bold').text(line.text).font('Helvetica').fontSize(10);
    else if (line.style === 'field') doc.fontSize(10).font('Helvetica-Bold').text(`${line.label}: `, { continued: true }).font('Helvetica').text(line.text);
    else if (line.style === 'caution') doc.fontSize(8).fillColor('#555').text(line.text);
    else doc.fontSize(10).text(line.text);
    if (line.gapAfter) doc.moveDown(line.gapAfter);
    previous = line.style;
  }
  doc.end();
  return done;
}
