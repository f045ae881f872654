/**
 * The calibration certificate as a PDF: a pure function of its data (no clock,
 * no randomness, no I/O beyond the bundled font files), so the same data
 * always gives the same bytes and the stored hash can be recomputed.
 * Contents follow ISO/IEC 17025:2017 §7.8.2–§7.8.6 as methods.md §9 lists them.
 */
import PDFDocument from 'pdfkit';
import QRCode from 'qrcode';
import { parseCertificateData, type CertificateData } from './certificate-data';
import { registerCertificateFonts } from './certificate-fonts';
import { formatAtDecimals, formatMeasuredValue, formatPercent, formatSignificant } from './certificate-numbers';
import {
  CERTIFICATE_SUBJECT,
  CERTIFICATE_TITLE,
  REPRODUCE_IN_FULL,
  RELATES_ONLY_TO_ITEM,
  SAFETY_CAUTION,
  decisionRuleDescriptions,
  decisionRuleNames,
  decisionWords,
  equipmentKindNames,
  methodDescriptions,
  methodNames,
  replacementStatement,
  responsibilityStatement,
  uncertaintyStatement,
  verificationInstruction,
} from './certificate-wording';
import { baselineBelow, ink, quantity, seg, styles, Typesetter, words, type Segment, type TextStyle } from './certificate-typesetter';
import { drawFocusCurvePlot, type FocusCurvePlotData } from './draw-focus-curve-plot';

const PAGE_WIDTH = 595.28;
const PAGE_HEIGHT = 841.89;
const LEFT = 56.69;
const RIGHT = PAGE_WIDTH - 56.69;
const CONTENT_WIDTH = RIGHT - LEFT;
const TOP = 48;
const FOOTER_TOP = 758;
const CONTENT_BOTTOM = FOOTER_TOP - 10;
const CELL_PAD_Y = 2.7;
const CELL_PAD_X = 4;

interface Column {
  header: string;
  /** Relative width; the table scales all widths to the content width. */
  width: number;
  align?: 'left' | 'right';
  /**
   * Cells that must stay on one line (a number with its unit, an identifier):
   * the column widens to its widest cell, taking the room from the column
   * that `gives` (else the first), which holds words and wraps well. The
   * header may still wrap.
   */
  nowrap?: boolean;
  gives?: boolean;
}

interface TableOptions {
  /** Height of what follows the table and must stay on the page with its last two rows (a summary line). */
  keepWithNext?: number;
}

/** The column that gives room keeps at least this share of its width when nowrap columns widen. */
const GIVING_COLUMN_MIN_SHARE = 0.6;
/** A page break leaves at least this many rows before it and after it (orphans and widows). */
const ROWS_BEFORE_BREAK = 3;
const ROWS_AFTER_BREAK = 2;

type Decision = CertificateData['conformity']['decision'];

/** Renders a certificate; the data is checked first (CertificateDataError names any bad field). */
export async function renderCertificatePdf(data: CertificateData): Promise<Buffer> {
  const checked = parseCertificateData(data);
  const verificationUrl = `${checked.verification.publicBaseUrl.replace(/\/+$/, '')}/verify/${checked.verification.code}`;
  const qrPng = await QRCode.toBuffer(verificationUrl, {
    type: 'png',
    errorCorrectionLevel: 'M',
    margin: 0,
    scale: 8,
    color: { dark: '#1B1F24', light: '#FFFFFF' },
  });
  const issuedAt = new Date(`${checked.certificate.issueDate}T00:00:00Z`);
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: TOP, bottom: 14, left: LEFT, right: PAGE_WIDTH - RIGHT },
    bufferPages: true,
    lang: 'en-GB',
    displayTitle: true,
    info: {
      Title: `${CERTIFICATE_TITLE} ${certificateReference(checked)}`,
      Subject: `${CERTIFICATE_SUBJECT}: ${checked.item.identifier}`,
      Author: checked.lab.name,
      Creator: 'Paraxia',
      Producer: 'Paraxia (pdfkit)',
      CreationDate: issuedAt,
      ModDate: issuedAt,
    },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<void>((resolve, reject) => {
    doc.on('end', () => resolve());
    doc.on('error', reject);
  });
  registerCertificateFonts(doc);

  const composer = new CertificateComposer(doc, checked);
  composer.compose(verificationUrl, qrPng);

  doc.end();
  await finished;
  return Buffer.concat(chunks);
}

function certificateReference(data: CertificateData): string {
  return `${data.certificate.number} rev ${data.certificate.revision}`;
}

class CertificateComposer {
  private readonly ts: Typesetter;
  private y = TOP;
  private sectionNumber = 0;

  constructor(
    private readonly doc: PDFKit.PDFDocument,
    private readonly data: CertificateData,
  ) {
    this.ts = new Typesetter(doc);
  }

  compose(verificationUrl: string, qrPng: Buffer): void {
    this.firstPageHeader();
    this.clientAndCertificate();
    this.item();
    this.methodAndConditions();
    this.resultSummary();
    this.results();
    this.conformity();
    this.focusCurves();
    this.uncertaintyBudget();
    this.equipment();
    this.remarks();
    this.signatures();
    this.verification(verificationUrl, qrPng);
    this.footers();
  }

  // ---------- page furniture ----------

  private newPage(): void {
    this.doc.addPage();
    const reference = certificateReference(this.data);
    this.ts.line([seg(this.data.lab.name, { ...styles.bodyStrong, size: 8.2 })], LEFT, TOP + 8);
    this.ts.line([seg(`${CERTIFICATE_TITLE}  `, styles.label), seg(reference, { ...styles.number, size: 8.2 })], LEFT, TOP + 8, { width: CONTENT_WIDTH, align: 'right' });
    this.ts.rule(LEFT, RIGHT, TOP + 14);
    this.y = TOP + 28;
  }

  private ensureSpace(height: number): void {
    if (this.y + height > CONTENT_BOTTOM) this.newPage();
  }

  private section(title: string, keepWithNext = 60): void {
    this.ensureSpace(26 + keepWithNext);
    this.sectionNumber += 1;
    this.y += 6;
    const baseline = baselineBelow(this.y, styles.heading);
    this.ts.line([seg(`${this.sectionNumber}`, { ...styles.heading, color: ink.muted }), seg(`   ${title}`, styles.heading)], LEFT, baseline);
    this.ts.rule(LEFT, RIGHT, this.y + 17, ink.hairline, 0.5);
    this.y += 22;
  }

  private footers(): void {
    const range = this.doc.bufferedPageRange();
    const reference = certificateReference(this.data);
    for (let i = 0; i < range.count; i += 1) {
      this.doc.switchToPage(range.start + i);
      this.ts.rule(LEFT, RIGHT, FOOTER_TOP, ink.rule, 0.5);
      let top = FOOTER_TOP + 5;
      top += this.ts.paragraph([seg(responsibilityStatement(this.data.lab.name), { ...styles.small, size: 6.8 })], LEFT, top, CONTENT_WIDTH, 0.8) + 2;
      top += this.ts.paragraph([seg(SAFETY_CAUTION, { ...styles.small, size: 6.8 })], LEFT, top, CONTENT_WIDTH, 0.8);
      const baseline = Math.max(top + 12, PAGE_HEIGHT - 30);
      this.ts.line([seg(reference, { ...styles.number, size: 7.4 }), seg(`   issued ${this.data.certificate.issueDate}`, styles.small)], LEFT, baseline);
      this.ts.line([seg(`Page ${i + 1} of ${range.count}`, { ...styles.bodyStrong, size: 7.6 })], LEFT, baseline, { width: CONTENT_WIDTH, align: 'right' });
    }
  }

  // ---------- generic blocks ----------

  /** A label column and a value column; values wrap when they do not fit one line. */
  private keyValues(rows: { label: string; value: Segment[] }[], x = LEFT, width = CONTENT_WIDTH, labelWidth = 136): void {
    for (const row of rows) {
      const valueWidth = width - labelWidth;
      const height = this.cellHeight(row.value, valueWidth) + 2.4;
      this.ensureSpace(height);
      this.ts.line([seg(row.label, styles.label)], x, baselineBelow(this.y, styles.body));
      this.cell(row.value, x + labelWidth, this.y, valueWidth, 'left');
      this.y += height;
    }
  }

  private cellHeight(segments: Segment[], width: number): number {
    const lineHeight = segments.reduce((h, s) => Math.max(h, s.style.size * 1.32), 0);
    return this.ts.widthOf(segments) <= width ? lineHeight : this.ts.heightOf(segments, width);
  }

  private cell(segments: Segment[], x: number, top: number, width: number, align: 'left' | 'right'): void {
    if (this.ts.widthOf(segments) <= width) {
      const tallest = segments.reduce<TextStyle>((t, s) => (s.style.size > t.size ? s.style : t), segments[0].style);
      this.ts.line(segments, x, baselineBelow(top, tallest), { width, align });
    } else {
      this.ts.paragraph(segments, x, top, width);
    }
  }

  private columnWidths(columns: Column[], rows: Segment[][][]): number[] {
    const scale = CONTENT_WIDTH / columns.reduce((sum, c) => sum + c.width, 0);
    const widths = columns.map((c) => c.width * scale);
    const giving = Math.max(0, columns.findIndex((c) => c.gives));
    let spare = widths[giving] * (1 - GIVING_COLUMN_MIN_SHARE);
    columns.forEach((column, i) => {
      if (!column.nowrap || i === giving) return;
      const needed = Math.max(0, ...rows.map((row) => this.ts.widthOf(row[i]))) + 2 * CELL_PAD_X + 0.5;
      const extra = Math.min(Math.max(0, needed - widths[i]), spare);
      widths[i] += extra;
      widths[giving] -= extra;
      spare -= extra;
    });
    return widths;
  }

  /** Height of the header and the rows a page break may not separate from the table's heading. */
  private tableLeadHeight(columns: Column[], rows: Segment[][][], options: TableOptions = {}): number {
    const widths = this.columnWidths(columns, rows);
    const headerHeight = this.rowHeight(columns.map((c) => [seg(c.header, { ...styles.label, size: 7.4 })]), widths);
    const wholeTable = rows.length <= ROWS_BEFORE_BREAK + ROWS_AFTER_BREAK - 1;
    const lead = rows.slice(0, wholeTable ? rows.length : ROWS_BEFORE_BREAK).reduce((sum, row) => sum + this.rowHeight(row, widths), 0);
    return headerHeight + lead + (wholeTable ? (options.keepWithNext ?? 0) : 0);
  }

  private rowHeight(row: Segment[][], widths: number[]): number {
    return Math.max(...row.map((cell, i) => this.cellHeight(cell, widths[i] - 2 * CELL_PAD_X))) + 2 * CELL_PAD_Y;
  }

  /**
   * A table whose header repeats on each page. A page break never leaves fewer
   * than three rows before it or fewer than two after it (orphans and widows),
   * and `keepWithNext` stays on the page of the last row.
   */
  private table(columns: Column[], rows: Segment[][][], options: TableOptions = {}): void {
    const widths = this.columnWidths(columns, rows);
    const headerCells = columns.map((c) => [seg(c.header, { ...styles.label, size: 7.4 })]);
    const headerHeight = this.rowHeight(headerCells, widths);
    const drawnHeights = rows.map((row) => this.rowHeight(row, widths));
    // For page breaks only: the last row carries what must follow it on the same page.
    const rowHeights = drawnHeights.map((h, i) => (i === rows.length - 1 ? h + (options.keepWithNext ?? 0) : h));
    const header = () => {
      let x = LEFT;
      headerCells.forEach((cell, i) => {
        this.cell(cell, x + CELL_PAD_X, this.y + CELL_PAD_Y, widths[i] - 2 * CELL_PAD_X, columns[i].align ?? 'left');
        x += widths[i];
      });
      this.y += headerHeight;
      this.ts.rule(LEFT, RIGHT, this.y, ink.text, 0.6);
    };

    let firstBreak = -1;
    let bottom = this.y + headerHeight;
    for (let i = 0; i < rows.length && firstBreak < 0; i += 1) {
      bottom += rowHeights[i];
      if (bottom > CONTENT_BOTTOM) firstBreak = i;
    }
    if (firstBreak >= 0 && rows.length - firstBreak < ROWS_AFTER_BREAK) firstBreak = rows.length - ROWS_AFTER_BREAK;
    if (firstBreak >= 0 && firstBreak < Math.min(ROWS_BEFORE_BREAK, rows.length)) {
      this.newPage();
      firstBreak = -1;
    }

    header();
    rows.forEach((row, r) => {
      if (r === firstBreak || this.y + rowHeights[r] > CONTENT_BOTTOM) {
        this.newPage();
        header();
      }
      let x = LEFT;
      row.forEach((cell, i) => {
        this.cell(cell, x + CELL_PAD_X, this.y + CELL_PAD_Y, widths[i] - 2 * CELL_PAD_X, columns[i].align ?? 'left');
        x += widths[i];
      });
      this.y += drawnHeights[r];
      this.ts.rule(LEFT, RIGHT, this.y, ink.hairline, 0.4);
    });
    this.y += 4;
  }

  private paragraph(segments: Segment[], gapAfter = 5): void {
    this.ensureSpace(this.ts.heightOf(segments, CONTENT_WIDTH) + 2);
    this.y += this.ts.paragraph(segments, LEFT, this.y, CONTENT_WIDTH) + gapAfter;
  }

  // ---------- page 1 ----------

  private firstPageHeader(): void {
    const { lab, certificate } = this.data;
    this.ts.line([seg(lab.name, { ...styles.heading, size: 13 })], LEFT, TOP + 12);
    let baseline = TOP + 25;
    const contact = [...lab.addressLines, [lab.email, lab.phone].filter(Boolean).join('   ')].filter(Boolean);
    for (const line of contact) {
      this.ts.line([seg(line, styles.small)], LEFT, baseline);
      baseline += 9.4;
    }
    this.ts.line([seg('Certificate number', styles.label)], LEFT, TOP + 10, { width: CONTENT_WIDTH, align: 'right' });
    this.ts.line([seg(certificateReference(this.data), { family: 'mono', weight: 600, size: 12.5, color: ink.text })], LEFT, TOP + 26, {
      width: CONTENT_WIDTH,
      align: 'right',
    });
    this.y = Math.max(baseline, TOP + 34) + 2;
    this.ts.rule(LEFT, RIGHT, this.y, ink.text, 0.9);
    this.y += 34;
    this.ts.line([seg(CERTIFICATE_TITLE, { family: 'serif', weight: 600, size: 25, color: ink.text })], LEFT, this.y);
    this.y += 17;
    this.ts.line([seg(CERTIFICATE_SUBJECT, { ...styles.body, size: 10.5, color: ink.muted })], LEFT, this.y);
    this.y += 12;
    if (certificate.replaces) {
      this.y += 4;
      const notice = [seg(replacementStatement(certificate.replaces.revision, certificate.replaces.reason), styles.bodyStrong)];
      const height = this.ts.heightOf(notice, CONTENT_WIDTH - 16);
      this.doc.save().rect(LEFT, this.y, CONTENT_WIDTH, height + 10).lineWidth(0.8).strokeColor(ink.text).stroke().restore();
      this.ts.paragraph(notice, LEFT + 8, this.y + 5, CONTENT_WIDTH - 16);
      this.y += height + 14;
    }
    this.y += 6;
  }

  private clientAndCertificate(): void {
    const { client, certificate, measurement, item } = this.data;
    const columnGap = 24;
    const leftWidth = (CONTENT_WIDTH - columnGap) * 0.48;
    const rightX = LEFT + leftWidth + columnGap;
    const top = this.y;

    this.ts.line([seg('Client', styles.label)], LEFT, baselineBelow(top, styles.label));
    let y = top + 13;
    this.ts.line([seg(client.name, styles.bodyStrong)], LEFT, baselineBelow(y, styles.bodyStrong));
    y += 12;
    for (const line of client.addressLines) {
      this.ts.line([words(line)], LEFT, baselineBelow(y, styles.body));
      y += 11.4;
    }
    if (client.orderReference) {
      y += 3;
      this.ts.line([seg('Order reference  ', styles.label), seg(client.orderReference, styles.number)], LEFT, baselineBelow(y, styles.body));
      y += 11.4;
    }
    const leftBottom = y;

    this.y = top;
    const dates = measurement.dates.join(', ');
    this.keyValues(
      [
        { label: 'Certificate number', value: [seg(certificate.number, styles.number)] },
        { label: 'Revision', value: [seg(String(certificate.revision), styles.number)] },
        { label: 'Date of issue', value: [seg(certificate.issueDate, styles.number)] },
        { label: measurement.dates.length > 1 ? 'Dates of measurement' : 'Date of measurement', value: [seg(dates, styles.number)] },
        ...(item.dateReceived ? [{ label: 'Item received', value: [seg(item.dateReceived, styles.number)] }] : []),
      ],
      rightX,
      RIGHT - rightX,
      104,
    );
    this.y = Math.max(this.y, leftBottom) + 4;
  }

  private item(): void {
    const { item, conformity } = this.data;
    this.section('Item measured');
    const nominalDecimals = decimalsShown(item.nominalFocalLengthMm);
    const toleranceText =
      item.tolerance.percent !== undefined
        ? quantity(`± ${formatAsGiven(item.tolerance.percent)}`, '%')
        : quantity(`± ${formatAsGiven(item.tolerance.mm!)}`, 'mm');
    const limitDecimals = Math.max(nominalDecimals, 2);
    this.keyValues([
      { label: 'Identifier', value: [seg(item.identifier, styles.number)] },
      ...(item.serialNumber ? [{ label: 'Serial number', value: [seg(item.serialNumber, styles.number)] }] : []),
      { label: 'Description', value: [words(item.description)] },
      ...(item.partNumber ? [{ label: 'Part number', value: [seg(item.partNumber, styles.number)] }] : []),
      {
        label: 'Nominal focal length',
        value: [
          ...quantity(formatAtDecimals(item.nominalFocalLengthMm, nominalDecimals), 'mm'),
          seg(item.nominalFocalLengthMm > 0 ? '   converging' : '   diverging', styles.unit),
        ],
      },
      {
        label: 'Tolerance',
        value: [
          ...toleranceText,
          seg('   limits ', styles.unit),
          ...quantity(formatAtDecimals(conformity.lowerLimitMm, limitDecimals), 'mm'),
          seg(' to ', styles.unit),
          ...quantity(formatAtDecimals(conformity.upperLimitMm, limitDecimals), 'mm'),
        ],
      },
      ...(item.condition ? [{ label: 'Condition on receipt', value: [words(item.condition)] }] : []),
    ]);
  }

  private methodAndConditions(): void {
    const { measurement } = this.data;
    this.section('Method and conditions');
    this.keyValues([
      {
        label: 'Method',
        value: [seg(methodNames[measurement.method], styles.bodyStrong), words(`. ${methodDescriptions[measurement.method]}`)],
      },
      ...(measurement.location ? [{ label: 'Place of measurement', value: [words(measurement.location)] }] : []),
      { label: 'Ambient temperature', value: quantity(formatAtDecimals(measurement.environment.temperatureC, 1), '°C') },
      { label: 'Relative humidity', value: quantity(formatAtDecimals(measurement.environment.relativeHumidityPercent, 0), '%') },
    ]);
  }

  private resultSummary(): void {
    const { results, conformity } = this.data;
    this.y += 10;
    const boxHeight = 92;
    this.ensureSpace(boxHeight + 4);
    const top = this.y;
    this.doc.save().rect(LEFT, top, CONTENT_WIDTH, boxHeight).lineWidth(0.9).strokeColor(ink.text).stroke().restore();

    const f = formatMeasuredValue({ value: results.focalLengthMm, uncertainty: results.expandedUncertaintyMm });
    const power = formatMeasuredValue({ value: results.opticalPowerDioptres, uncertainty: results.opticalPowerExpandedUncertaintyDioptres });
    const inner = LEFT + 14;
    this.ts.line([seg('Measured focal length', styles.label)], inner, top + 17);
    const big = { family: 'mono', weight: 600, size: 24, color: ink.text } as const;
    const after = this.ts.line([seg(f.valueText, big), seg(' mm', { ...styles.unit, size: 13 })], inner, top + 45);
    this.ts.line([seg('U = ', { ...styles.unit, size: 11 }), ...quantity(f.uncertaintyText, 'mm', { ...styles.number, size: 12 }, { ...styles.unit, size: 11 })], inner + after + 14, top + 45);
    this.ts.line(
      [
        seg('k = ', styles.unit),
        seg(formatAtDecimals(results.coverageFactor, 2), styles.number),
        seg(',  coverage probability approximately ', styles.unit),
        ...quantity(formatPercent(results.coverageProbability), '%'),
      ],
      inner,
      top + 62,
    );
    this.ts.line(
      [seg('Optical power  ', styles.label), ...quantity(power.valueText, 'D'), seg('   U = ', styles.unit), ...quantity(power.uncertaintyText, 'D')],
      inner,
      top + 78,
    );

    const dividerX = LEFT + CONTENT_WIDTH * 0.62;
    this.doc.save().moveTo(dividerX, top + 10).lineTo(dividerX, top + boxHeight - 10).lineWidth(0.5).strokeColor(ink.hairline).stroke().restore();
    const sx = dividerX + 16;
    this.ts.line([seg('Against the tolerance', styles.label)], sx, top + 17);
    drawDecisionSymbol(this.doc, conformity.decision, sx + 11, top + 39, 10);
    this.ts.line([seg(decisionWords[conformity.decision], { family: 'sans', weight: 600, size: 13, color: ink.text })], sx + 28, top + 44);
    const rule = conformity.rule === 'simple' ? 'simple acceptance' : 'guarded acceptance (w = U)';
    this.ts.paragraph([seg(`Decision rule: ${rule}; the statement and its basis follow the results.`, styles.small)], sx, top + 58, RIGHT - sx - 10);
    this.y = top + boxHeight + 8;
  }

  // ---------- results ----------

  private results(): void {
    const { results } = this.data;
    this.section('Results');
    const k = formatAtDecimals(results.coverageFactor, 2);
    const f = formatMeasuredValue({ value: results.focalLengthMm, uncertainty: results.expandedUncertaintyMm });
    const power = formatMeasuredValue({ value: results.opticalPowerDioptres, uncertainty: results.opticalPowerExpandedUncertaintyDioptres });
    const rows: Segment[][][] = [
      [[words('Focal length f')], quantity(f.valueText, 'mm'), [seg('U = ', styles.unit), ...quantity(f.uncertaintyText, 'mm')], [seg(`expanded, k = ${k}`, styles.unit)]],
      [[words('Optical power P = 1000 / f')], quantity(power.valueText, 'D'), [seg('U = ', styles.unit), ...quantity(power.uncertaintyText, 'D')], [seg(`expanded, k = ${k}`, styles.unit)]],
    ];
    const withStandard = (label: string, value: number, u: number | undefined) => {
      if (u !== undefined && u > 0) {
        const text = formatMeasuredValue({ value, uncertainty: u });
        rows.push([[words(label)], quantity(text.valueText, 'mm'), [seg('u = ', styles.unit), ...quantity(text.uncertaintyText, 'mm')], [seg('standard, k = 1', styles.unit)]]);
      } else {
        rows.push([[words(label)], quantity(formatSignificant(value, 5), 'mm'), [seg('not evaluated', styles.unit)], []]);
      }
    };
    if (results.backFocalDistanceMm !== undefined) withStandard('Back focal distance', results.backFocalDistanceMm, results.backFocalDistanceStandardUncertaintyMm);
    if (results.principalPlanes) {
      withStandard('Front principal-plane offset h', results.principalPlanes.frontOffsetMm, results.principalPlanes.frontOffsetStandardUncertaintyMm);
      withStandard('Rear principal-plane offset h′', results.principalPlanes.rearOffsetMm, results.principalPlanes.rearOffsetStandardUncertaintyMm);
    }
    this.table(
      [
        { header: 'Quantity', width: 190 },
        { header: 'Value', width: 95, align: 'right' },
        { header: 'Uncertainty', width: 95, align: 'right' },
        { header: '', width: 100 },
      ],
      rows,
    );

    const dof = results.effectiveDegreesOfFreedom;
    const dofText = dof === undefined ? null : dof === null || dof === Infinity ? 'infinitely many' : String(Math.floor(dof));
    this.paragraph([seg(uncertaintyStatement(k, formatPercent(results.coverageProbability), dofText), styles.body)], 8);

    const sweepRows: Segment[][][] = [];
    results.sweeps.forEach((sweep) => {
      const peaks = [
        { positionMm: sweep.focusCurve.bestFocusPositionMm, uMm: sweep.focusCurve.bestFocusStandardUncertaintyMm },
        ...(sweep.focusCurve.secondPeak
          ? [{ positionMm: sweep.focusCurve.secondPeak.bestFocusPositionMm, uMm: sweep.focusCurve.secondPeak.bestFocusStandardUncertaintyMm }]
          : []),
      ];
      peaks.forEach((peak, p) => {
        const position = peak.uMm > 0 ? formatMeasuredValue({ value: peak.positionMm, uncertainty: peak.uMm }) : null;
        const m = sweep.magnifications[p];
        sweepRows.push([
          [words(peaks.length > 1 ? `${sweep.label}, sharp position ${p + 1}` : sweep.label)],
          quantity(position ? position.valueText : formatSignificant(peak.positionMm, 6), 'mm'),
          position ? quantity(position.uncertaintyText, 'mm') : [seg('—', styles.unit)],
          m !== undefined ? [seg(formatSignificant(m, 5), styles.number)] : [seg('not measured', styles.unit)],
        ]);
      });
    });
    this.ensureSpace(60);
    this.y += 2;
    this.ts.line([seg('Best focus and magnification per sweep', styles.bodyStrong)], LEFT, baselineBelow(this.y, styles.bodyStrong));
    this.y += 14;
    this.table(
      [
        { header: 'Sweep', width: 190 },
        { header: 'Best-focus rail position', width: 110, align: 'right' },
        { header: 'Standard uncertainty u', width: 100, align: 'right' },
        { header: 'Magnification |m|', width: 80, align: 'right' },
      ],
      sweepRows,
    );
  }

  private focusCurves(): void {
    const panels = this.data.results.sweeps.flatMap(focusCurvePanels);
    const shown = panels.slice(0, 4);
    const single = shown.length === 1;
    const plotHeight = single ? 186 : 140;
    this.section('Focus curve', single ? plotHeight : plotHeight + 4);
    const columns = shown.length === 3 ? 3 : single ? 1 : 2;
    const gap = 18;
    const plotWidth = (CONTENT_WIDTH - gap * (columns - 1)) / columns;
    for (let i = 0; i < shown.length; i += columns) {
      this.ensureSpace(plotHeight + 4);
      for (let c = 0; c < columns && i + c < shown.length; c += 1) {
        const panel = shown[i + c];
        drawFocusCurvePlot(this.ts, {
          x: LEFT + c * (plotWidth + gap),
          y: this.y,
          width: plotWidth,
          height: plotHeight,
          title: single ? `${panel.title}: focus measure through focus` : panel.title,
          curve: panel.curve,
          compact: !single,
        });
      }
      this.y += plotHeight + 6;
    }
    const key = single ? '' : ' Open circles: measured frames; black line: fitted peak model; blue line and band: best focus and its standard uncertainty u.';
    const more = panels.length > shown.length ? `The first ${shown.length} of ${panels.length} focus curves are drawn.` : '';
    if (key || more) this.paragraph([seg(`${more}${key}`.trim(), styles.small)], 4);
  }

  private uncertaintyBudget(): void {
    const budget = this.data.results.uncertaintyBudget;
    const columns: Column[] = [
      { header: 'Source of uncertainty', width: 124 },
      { header: 'Value', width: 66, align: 'right', nowrap: true },
      { header: 'Standard uncertainty', width: 62, align: 'right', nowrap: true },
      { header: 'Degrees of freedom', width: 50, align: 'right', nowrap: true },
      { header: 'Sensitivity coefficient', width: 68, align: 'right', nowrap: true },
      { header: 'Contribution', width: 64, align: 'right', nowrap: true },
      { header: 'Share of variance', width: 44, align: 'right', nowrap: true },
    ];
    const rows = budget.map((row): Segment[][] => {
      const sensitivityUnit = row.unit === 'mm' ? '' : row.unit ? `mm/${row.unit}` : 'mm';
      return [
        [words(keepLabelNumbers(row.source))],
        quantity(row.standardUncertainty > 0 ? formatMeasuredValue({ value: row.value, uncertainty: row.standardUncertainty }).valueText : formatAsGiven(row.value), row.unit),
        quantity(row.standardUncertainty > 0 ? formatSignificant(row.standardUncertainty, 2) : '0', row.unit),
        [seg(row.degreesOfFreedom === null || row.degreesOfFreedom === Infinity ? 'inf.' : String(Math.floor(row.degreesOfFreedom)), styles.number)],
        quantity(formatSignificant(row.sensitivity, 3), sensitivityUnit),
        quantity(row.contributionMm > 0 ? formatSignificant(row.contributionMm, 2) : '0', 'mm'),
        quantity(formatAtDecimals(row.varianceShare * 100, 1), '%'),
      ];
    });
    const { results } = this.data;
    const u = formatSignificant(results.standardUncertaintyMm, 2);
    const summary = [
      seg('Combined standard uncertainty u(f) = ', styles.body),
      ...quantity(u, 'mm'),
      seg('. Contribution = |sensitivity coefficient| × standard uncertainty, in mm. "inf." marks an input whose standard uncertainty is taken as exactly known (Type B, infinite degrees of freedom).', styles.body),
    ];
    const summaryHeight = this.ts.heightOf(summary, CONTENT_WIDTH) + 6;
    this.section('Uncertainty budget', this.tableLeadHeight(columns, rows, { keepWithNext: summaryHeight }));
    this.table(columns, rows, { keepWithNext: summaryHeight });
    this.paragraph(summary, 4);
  }

  // ---------- conformity, equipment, people ----------

  private conformity(): void {
    const { conformity, results, item } = this.data;
    // Heading, rule text, limits and the statement box stay on one page.
    const sectionHeight =
      this.ts.heightOf([words(decisionRuleDescriptions[conformity.rule])], CONTENT_WIDTH - 136) + 12 * (conformity.rule === 'guarded' ? 4 : 3) + 60;
    this.section('Decision rule and statement of conformity', sectionHeight);
    const f = formatMeasuredValue({ value: results.focalLengthMm, uncertainty: results.expandedUncertaintyMm });
    const limitDecimals = Math.max(decimalsShown(item.nominalFocalLengthMm), 2);
    const lower = formatAtDecimals(conformity.lowerLimitMm, limitDecimals);
    const upper = formatAtDecimals(conformity.upperLimitMm, limitDecimals);
    this.keyValues([
      { label: 'Decision rule', value: [seg(decisionRuleNames[conformity.rule], styles.bodyStrong)] },
      { label: '', value: [words(decisionRuleDescriptions[conformity.rule])] },
      { label: 'Tolerance limits', value: [...quantity(lower, 'mm'), seg(' to ', styles.unit), ...quantity(upper, 'mm')] },
    ]);
    if (conformity.rule === 'guarded') {
      const accLower = formatAtDecimals(conformity.lowerLimitMm + results.expandedUncertaintyMm, f.decimals);
      const accUpper = formatAtDecimals(conformity.upperLimitMm - results.expandedUncertaintyMm, f.decimals);
      this.keyValues([{ label: 'Acceptance zone', value: [...quantity(accLower, 'mm'), seg(' to ', styles.unit), ...quantity(accUpper, 'mm')] }]);
    }
    const statement = conformityStatement(conformity.decision, conformity.rule, `${f.valueText} mm`, `${f.uncertaintyText} mm`, `${lower} mm to ${upper} mm`);
    const textX = LEFT + 44;
    const textWidth = RIGHT - textX - 10;
    const statementSegments = [seg(`${decisionWords[conformity.decision]}. `, styles.bodyStrong), words(statement)];
    const height = Math.max(this.ts.heightOf(statementSegments, textWidth) + 16, 40);
    this.ensureSpace(height + 10);
    const top = this.y + 4;
    this.doc.save().rect(LEFT, top, CONTENT_WIDTH, height).lineWidth(0.8).strokeColor(ink.text).stroke().restore();
    drawDecisionSymbol(this.doc, conformity.decision, LEFT + 22, top + height / 2, 11);
    this.ts.paragraph(statementSegments, textX, top + 8, textWidth);
    this.y = top + height + 8;
  }

  private equipment(): void {
    const { equipment } = this.data;
    this.section('Equipment used', 50);
    this.table(
      [
        { header: 'Kind', width: 62 },
        // Room for 16 monospaced characters, the usual register identifier ("CAM-794f/cfa4fe").
        { header: 'Identifier', width: 92, nowrap: true },
        { header: 'Description', width: 150, gives: true },
        { header: 'Calibration reference', width: 100, nowrap: true },
        { header: 'Calibration due', width: 76, align: 'right', nowrap: true },
      ],
      equipment.map((entry) => [
        [words(equipmentKindNames[entry.kind])],
        [seg(entry.identifier, styles.number)],
        [words(keepUnitsWithNumbers(entry.description))],
        [seg(entry.calibrationReference, styles.number)],
        [seg(`${entry.calibrationDueDate}${entry.override ? ' †' : ''}`, styles.number)],
      ]),
    );
    for (const entry of equipment.filter((e) => e.override)) {
      const override = entry.override!;
      this.paragraph(
        [
          seg(`† ${entry.identifier} was used after its calibration due date ${entry.calibrationDueDate} under an override recorded by ${override.approvedBy} on ${override.approvedOn}. Reason: `, styles.body),
          words(override.reason),
        ],
        3,
      );
    }
  }

  private remarks(): void {
    const remarks = this.data.remarks ?? [];
    if (remarks.length === 0) return;
    this.section('Remarks', 30);
    for (const remark of remarks) this.paragraph([words(remark)], 4);
  }

  private signatures(): void {
    const { people } = this.data;
    this.section('Performed and authorised', 90);
    const columnWidth = (CONTENT_WIDTH - 24) / 2;
    const top = this.y;
    const block = (x: number, title: string, persons: { name: string; role: string; date: string }[]) => {
      let y = top;
      this.ts.line([seg(title, styles.label)], x, baselineBelow(y, styles.label));
      y += 13;
      for (const person of persons) {
        this.ts.line([seg(person.name, styles.bodyStrong)], x, baselineBelow(y, styles.bodyStrong));
        y += 11.5;
        this.ts.line([words(person.role), seg('   ', styles.body), seg(person.date, styles.number)], x, baselineBelow(y, styles.body));
        y += 15;
      }
      return y;
    };
    const leftBottom = block(LEFT, 'Measurement performed by', people.performedBy);
    const rightBottom = block(LEFT + columnWidth + 24, 'Certificate authorised by', [people.authorisedBy]);
    this.y = Math.max(leftBottom, rightBottom);
    this.paragraph(
      [
        seg(
          `Authorised electronically in the laboratory's records by ${people.authorisedBy.name}, who did not take part in the measurement. The verification code below confirms the authorisation.`,
          styles.small,
        ),
      ],
      6,
    );
    this.paragraph([seg(RELATES_ONLY_TO_ITEM, styles.bodyStrong)], 2);
    this.paragraph([seg(REPRODUCE_IN_FULL, styles.bodyStrong)], 4);
  }

  private verification(url: string, qrPng: Buffer): void {
    const qrSize = 66;
    const height = qrSize + 14;
    this.y += 4;
    this.ensureSpace(height + 4);
    const top = this.y;
    this.doc.save().rect(LEFT, top, CONTENT_WIDTH, height).lineWidth(0.5).strokeColor(ink.rule).stroke().restore();
    this.doc.image(qrPng, LEFT + 7, top + 7, { width: qrSize, height: qrSize });
    const tx = LEFT + qrSize + 24;
    this.ts.line([seg('Verification code', styles.label)], tx, top + 17);
    this.ts.line([seg(this.data.verification.code, { family: 'mono', weight: 600, size: 15, color: ink.text })], tx, top + 36);
    this.ts.line([seg(url, { ...styles.number, size: 8 })], tx, top + 52);
    this.ts.paragraph([seg(verificationInstruction('the address above or by scanning the code.'), styles.small)], tx, top + 58, RIGHT - tx - 10);
    this.y = top + height + 6;
  }
}

/** No line break inside "sweep 1" or "position 2" when a budget source wraps. */
function keepLabelNumbers(text: string): string {
  return text.replace(/\b(sweep|position) (\d+)/gi, '$1\u00A0$2');
}

/** No line break between a number and its unit ("0.01 mm" stays on one line). */
function keepUnitsWithNumbers(text: string): string {
  return text.replace(/(\d) (mm|µm|nm|m|°C|%|D|px)(?=$|[\s,;.)])/g, '$1\u00A0$2');
}

type Sweep = CertificateData['results']['sweeps'][number];

/**
 * One plot per sharp position: a displacement sweep's two peaks lie far apart
 * on the rail, and drawn together each would be a thin spike.
 */
function focusCurvePanels(sweep: Sweep): { title: string; curve: FocusCurvePlotData }[] {
  const { secondPeak, ...first } = sweep.focusCurve;
  if (!secondPeak) return [{ title: sweep.label, curve: first }];
  const splitMm = (first.bestFocusPositionMm + secondPeak.bestFocusPositionMm) / 2;
  const nearFirst = (z: number) => (z < splitMm) === (first.bestFocusPositionMm < splitMm);
  const pick = (keep: (z: number) => boolean) => {
    const indices = first.positionsMm.map((z, i) => (keep(z) ? i : -1)).filter((i) => i >= 0);
    return { positionsMm: indices.map((i) => first.positionsMm[i]), focusValues: indices.map((i) => first.focusValues[i]) };
  };
  return [
    { title: `${sweep.label}, sharp position 1`, curve: { ...first, ...pick(nearFirst) } },
    {
      title: `${sweep.label}, sharp position 2`,
      curve: {
        ...pick((z) => !nearFirst(z)),
        curve: secondPeak.curve,
        bestFocusPositionMm: secondPeak.bestFocusPositionMm,
        bestFocusStandardUncertaintyMm: secondPeak.bestFocusStandardUncertaintyMm,
      },
    },
  ];
}

/** A number the user typed (a tolerance), without padding zeros: 1 → "1", 0.5 → "0.5". */
function formatAsGiven(value: number): string {
  return formatAtDecimals(value, decimalsShown(value));
}

/** Decimal places needed to show a value as given (at most 6). */
function decimalsShown(value: number): number {
  for (let d = 0; d <= 6; d += 1) if (Math.abs(Number(value.toFixed(d)) - value) < 1e-9) return d;
  return 6;
}

function conformityStatement(decision: Decision, rule: 'simple' | 'guarded', measured: string, uncertainty: string, tolerance: string): string {
  if (rule === 'simple') {
    return decision === 'conforms'
      ? `The measured focal length ${measured} lies within the tolerance limits ${tolerance}. The expanded uncertainty U = ${uncertainty} is reported but not used as a guard band.`
      : `The measured focal length ${measured} lies outside the tolerance limits ${tolerance}. The expanded uncertainty U = ${uncertainty} is reported but not used as a guard band.`;
  }
  if (decision === 'conforms') return `The measured focal length ${measured} lies inside the tolerance limits ${tolerance} by at least U = ${uncertainty}.`;
  if (decision === 'does-not-conform') return `The measured focal length ${measured} lies outside the tolerance limits ${tolerance} by more than U = ${uncertainty}.`;
  return `The measured focal length ${measured} lies within U = ${uncertainty} of a tolerance limit (${tolerance}), so conformity cannot be decided at this uncertainty.`;
}

/** Circle with a tick, a cross or a question mark: the decision is readable without colour. */
function drawDecisionSymbol(doc: PDFKit.PDFDocument, decision: Decision, cx: number, cy: number, r: number): void {
  doc.save().lineWidth(1.2).strokeColor(ink.text).circle(cx, cy, r).stroke();
  doc.lineWidth(1.7).lineCap('round').lineJoin('round');
  if (decision === 'conforms') {
    doc.moveTo(cx - r * 0.45, cy + r * 0.02).lineTo(cx - r * 0.1, cy + r * 0.38).lineTo(cx + r * 0.48, cy - r * 0.36).stroke();
  } else if (decision === 'does-not-conform') {
    const d = r * 0.4;
    doc.moveTo(cx - d, cy - d).lineTo(cx + d, cy + d).moveTo(cx + d, cy - d).lineTo(cx - d, cy + d).stroke();
  } else {
    doc.moveTo(cx - r * 0.3, cy - r * 0.25).bezierCurveTo(cx - r * 0.3, cy - r * 0.65, cx + r * 0.35, cy - r * 0.65, cx + r * 0.3, cy - r * 0.25);
    doc.bezierCurveTo(cx + r * 0.27, cy, cx, cy, cx, cy + r * 0.18).stroke();
    doc.circle(cx, cy + r * 0.48, r * 0.06).fillAndStroke(ink.text, ink.text);
  }
  doc.restore();
}
