// The review pack as a PDF, drawn with pdfkit from the same answer the page shows: the project and
// period, the waterfall of the best path (vector bars with their 95 % whiskers), the top builds,
// the durability summary and the open review threads. Text stays text (searchable, copyable);
// the standard Helvetica family is used, so every label is written in its Latin-1 characters.
import PDFDocument from 'pdfkit';
import { CURVE_METRICS, type CurveMetricKey } from '../../shared/curves/metric-catalogue';
import type { ReviewPack } from '../../shared/api-types';
import { roundSignificant } from '../../shared/units/significant';

const INK = '#1f2a44';
const MUTED = '#5b6478';
const COPPER = '#b4622d';
const GRID = '#d9dce3';
const MARGIN = 48;

function shown(key: CurveMetricKey, value: number | null | undefined): string {
  if (value == null || !Number.isFinite(value)) return '-';
  const m = CURVE_METRICS[key];
  return `${(value * m.scale).toFixed(m.digits)} ${m.displayUnit}`;
}

function signed(value: number, digits: number): string {
  return `${value >= 0 ? '+' : '-'}${Math.abs(value).toFixed(digits)}`;
}

/** One table: a header row and rows of cells, column widths in points; wraps to a new page. */
function table(doc: PDFKit.PDFDocument, header: string[], rows: string[][], widths: number[]) {
  const draw = (cells: string[], bold: boolean) => {
    const y = doc.y;
    const height = Math.max(...cells.map((cell, c) => doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(9).heightOfString(cell, { width: widths[c]! - 6 })));
    if (y + height > doc.page.height - MARGIN) doc.addPage();
    const top = doc.y;
    let x = MARGIN;
    cells.forEach((cell, c) => {
      doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(9).fillColor(bold ? INK : '#222').text(cell, x + 3, top, { width: widths[c]! - 6 });
      x += widths[c]!;
    });
    doc.y = top + height + 4;
    doc.moveTo(MARGIN, doc.y - 2).lineTo(MARGIN + widths.reduce((a, b) => a + b, 0), doc.y - 2).strokeColor(GRID).lineWidth(0.5).stroke();
  };
  draw(header, true);
  for (const row of rows) draw(row, false);
  doc.moveDown(0.5);
}

function heading(doc: PDFKit.PDFDocument, text: string) {
  if (doc.y > doc.page.height - MARGIN - 80) doc.addPage();
  doc.moveDown(0.6).font('Helvetica-Bold').fontSize(13).fillColor(INK).text(text, MARGIN);
  doc.moveDown(0.3);
}

/** The waterfall: the baseline bar, then each step's change as a floating bar with its 95 % whisker. */
function waterfall(doc: PDFKit.PDFDocument, pack: ReviewPack) {
  const gains = pack.gains!;
  const key = pack.response.key as CurveMetricKey;
  const m = CURVE_METRICS[key];
  const steps = gains.steps;
  const width = doc.page.width - 2 * MARGIN;
  const height = 200;
  if (doc.y + height + 40 > doc.page.height - MARGIN) doc.addPage();
  const top = doc.y + 8;
  const values = steps.flatMap((s, i) => {
    const before = i === 0 ? s.value : steps[i - 1]!.value;
    const whisker = s.gain != null && s.low != null && s.high != null ? [before + s.low, before + s.high] : [];
    return [s.value, before, ...whisker];
  });
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const pad = (hi - lo) * 0.15 || Math.abs(hi) * 0.01 || 0.001;
  const yMin = lo - pad;
  const yMax = hi + pad;
  const y = (value: number) => top + height - ((value - yMin) / (yMax - yMin)) * height;
  const slot = width / steps.length;
  const bar = Math.min(42, slot * 0.55);
  // axis and gridlines with labels in the display unit
  doc.lineWidth(0.5).strokeColor(GRID);
  for (let k = 0; k <= 4; k++) {
    const value = yMin + ((yMax - yMin) * k) / 4;
    doc.moveTo(MARGIN, y(value)).lineTo(MARGIN + width, y(value)).stroke();
    doc.font('Helvetica').fontSize(7).fillColor(MUTED).text((value * m.scale).toFixed(m.digits), MARGIN - 40, y(value) - 3, { width: 36, align: 'right' });
  }
  steps.forEach((s, i) => {
    const centre = MARGIN + slot * i + slot / 2;
    const before = i === 0 ? yMin : steps[i - 1]!.value;
    const a = y(Math.max(before, s.value));
    const b = y(Math.min(before, s.value));
    const colour = i === 0 ? INK : s.withinNoise ? MUTED : s.gain != null && (s.gain >= 0) === (m.goal === 'maximize') ? COPPER : '#6c3f8a';
    doc.rect(centre - bar / 2, a, bar, Math.max(1, b - a)).fillColor(colour).fill();
    if (i > 0 && s.low != null && s.high != null) {
      const prev = steps[i - 1]!.value;
      doc.moveTo(centre, y(prev + s.high)).lineTo(centre, y(prev + s.low)).strokeColor(INK).lineWidth(0.8).stroke();
      doc.moveTo(centre - 4, y(prev + s.high)).lineTo(centre + 4, y(prev + s.high)).stroke();
      doc.moveTo(centre - 4, y(prev + s.low)).lineTo(centre + 4, y(prev + s.low)).stroke();
    }
    // the label sits above the bar and its whisker, never on them
    const whiskerTop = i > 0 && s.high != null ? Math.min(a, y(steps[i - 1]!.value + s.high)) : a;
    const label = i === 0 ? (s.value * m.scale).toFixed(m.digits) : s.gain == null ? '' : `${signed(s.gain * m.scale, m.digits)}${s.withinNoise ? ' (noise)' : ''}`;
    doc.font('Helvetica').fontSize(7).fillColor(INK).text(label, centre - slot / 2, whiskerTop - 11, { width: slot, align: 'center' });
    doc.font('Helvetica').fontSize(7).fillColor(MUTED).text(s.code, centre - slot / 2, top + height + 4, { width: slot, align: 'center' });
  });
  doc.y = top + height + 18;
  doc.font('Helvetica').fontSize(8).fillColor(MUTED).text(
    `${m.label} in ${m.displayUnit} along the lineage's best path, at j_ref = ${pack.project.refCurrentDensity} A/cm². Bars: baseline value, then each step's change; whiskers: 95 % interval of the change. Copper: a gain beyond noise; grey: within noise; violet: a loss beyond noise.`,
    MARGIN, doc.y, { width },
  );
  const total = gains.total;
  doc.moveDown(0.3).font('Helvetica-Bold').fontSize(9).fillColor(INK).text(`Total from ${gains.baseline.code}: ${signed(total.gain * m.scale, m.digits)} ${m.displayUnit}${total.low != null && total.high != null ? ` (95 % interval ${signed(total.low * m.scale, m.digits)} to ${signed(total.high * m.scale, m.digits)})` : ''}`);
}

/** A target's status in words: met by which build and when, or the best so far and the gap. */
export function targetStatusText(t: ReviewPack['targets'][number]): string {
  const digits = (value: number) => String(roundSignificant(value, 4));
  if (t.status.state === 'met' && t.status.metBy) return `met by ${t.status.metBy.code} on ${t.status.metBy.date}`;
  if (t.status.state === 'not-yet' && t.status.best) return `not yet - best ${digits(t.status.best.value)} ${t.unit} (${t.status.best.code}), gap ${digits(Math.abs(t.status.gap ?? 0))} ${t.unit}`;
  return 'no comparable build yet';
}

/** Writes the pack to a PDF and returns its bytes. */
export function reviewPackPdf(pack: ReviewPack): Promise<Buffer> {
  // compress: false keeps the text readable in the file itself (tests and search tools find it)
  const doc = new PDFDocument({ size: 'A4', margin: MARGIN, compress: false, info: { Title: `Review pack - ${pack.project.name}`, Creator: 'Cellwright' } });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  const width = doc.page.width - 2 * MARGIN;
  const period = pack.period.from || pack.period.to ? `Builds from ${pack.period.from ?? 'the start'} to ${pack.period.to ?? 'today'}` : 'All builds of the project';

  doc.font('Helvetica').fontSize(9).fillColor(MUTED).text('Cellwright review pack', MARGIN, MARGIN);
  doc.font('Helvetica-Bold').fontSize(18).fillColor(INK).text(pack.project.name, { width });
  if (pack.project.description) doc.font('Helvetica').fontSize(10).fillColor('#333').text(pack.project.description, { width });
  doc.moveDown(0.3).font('Helvetica').fontSize(9).fillColor(MUTED).text(`${period} · reference point j_ref = ${pack.project.refCurrentDensity} A/cm², V_ref = ${pack.project.refVoltage} V · made ${pack.generatedAt.slice(0, 10)}`, { width });

  heading(doc, 'Targets');
  if (pack.targets.length === 0) doc.font('Helvetica').fontSize(10).fillColor('#333').text('No targets are set for this project.', { width });
  else table(doc, ['Target', 'Goal', 'Status', 'Due'], pack.targets.map((t) => [t.name || t.metricLabel, `${t.metricLabel} ${t.comparator === '>=' ? 'at least' : 'at most'} ${t.value} ${t.unit}${t.basis ? ` (per g ${t.basis})` : ''}${t.conditions ? `, ${t.conditions}` : ''}`, targetStatusText(t), t.dueDate ?? '-']), [110, 170, 170, width - 450]);

  heading(doc, `Waterfall of ${CURVE_METRICS[pack.response.key as CurveMetricKey].label}`);
  if (pack.gains && pack.gains.steps.length >= 2) waterfall(doc, pack);
  else doc.font('Helvetica').fontSize(10).fillColor('#333').text(pack.gainsNote ?? 'No waterfall yet.', { width });

  heading(doc, 'Top builds');
  if (pack.topBuilds.length === 0) doc.font('Helvetica').fontSize(10).text('No build in this period has a polarization curve of record yet.');
  else table(doc, ['Build', 'Tested', 'V at j_ref', 'iR-free V', 'Mass activity', 'Peak power', 'Change'], pack.topBuilds.map((b) => [b.code, b.testedOn ?? '-', shown('vAtRef', b.values.vAtRef), shown('vAtRefIrFree', b.values.vAtRefIrFree), shown('massActivity', b.values.massActivity), shown('peakPower', b.values.peakPower), b.changeNote ?? '']), [52, 60, 62, 62, 70, 66, width - 372]);

  heading(doc, 'Durability');
  if (pack.durability.length === 0) doc.font('Helvetica').fontSize(10).text('No durability log of record in this period.');
  else table(doc, ['Build', 'Degradation rate', '95 % interval', 'Hours run', 'Break-in'], pack.durability.map((d) => [d.code, d.degradationRate == null ? '-' : `${d.degradationRate.toFixed(1)} µV/h`, d.low != null && d.high != null ? `${d.low.toFixed(1)} to ${d.high.toFixed(1)} µV/h` : '-', d.hoursRun == null ? '-' : `${Math.round(d.hoursRun)} h`, d.breakInHours == null ? '-' : `${Math.round(d.breakInHours)} h`]), [60, 100, 130, 80, width - 370]);

  heading(doc, 'Waiting for a verdict');
  if (pack.openThreads.length === 0) doc.font('Helvetica').fontSize(10).text('No tested build is waiting for a verdict.');
  else table(doc, ['Build', 'Tested', 'Waiting', 'Last comment'], pack.openThreads.map((t) => [t.code, t.testedOn ?? '-', t.waitingDays == null ? '-' : `${t.waitingDays} d`, t.lastComment ? `${t.lastComment.author}: ${t.lastComment.body}` : 'no comment yet']), [60, 70, 60, width - 190]);

  doc.end();
  return done;
}
