/**
 * Drawing primitives for the certificate on top of pdfkit: styled segments
 * (number in mono, unit in a lighter colour, words in sans), cut into font
 * runs so latin-ext characters come from the file that holds them.
 */
import { fontAscender, fontRuns, type CertificateFontFamily, type CertificateFontWeight } from './certificate-fonts';

export const ink = {
  text: '#1B1F24',
  muted: '#5B626A',
  rule: '#9AA1A8',
  hairline: '#D3D7DB',
  grid: '#E6E9EC',
  /** Reserved for where focus is: the best-focus marker and nothing else. */
  focus: '#2446A8',
} as const;

export interface TextStyle {
  family: CertificateFontFamily;
  weight: CertificateFontWeight;
  size: number;
  color: string;
}

export interface Segment {
  text: string;
  style: TextStyle;
}

export const styles = {
  body: { family: 'sans', weight: 400, size: 8.8, color: ink.text },
  bodyStrong: { family: 'sans', weight: 600, size: 8.8, color: ink.text },
  label: { family: 'sans', weight: 400, size: 7.8, color: ink.muted },
  small: { family: 'sans', weight: 400, size: 7.2, color: ink.muted },
  number: { family: 'mono', weight: 400, size: 8.6, color: ink.text },
  unit: { family: 'sans', weight: 400, size: 8.2, color: ink.muted },
  heading: { family: 'serif', weight: 600, size: 11.5, color: ink.text },
} satisfies Record<string, TextStyle>;

export const seg = (text: string, style: TextStyle): Segment => ({ text, style });
export const words = (text: string): Segment => seg(text, styles.body);
/** A number in mono and its unit in a lighter sans, separated by a space. */
export const quantity = (numberText: string, unit: string, numberStyle: TextStyle = styles.number, unitStyle: TextStyle = styles.unit): Segment[] =>
  unit ? [seg(numberText, numberStyle), seg(` ${unit}`, unitStyle)] : [seg(numberText, numberStyle)];

export class Typesetter {
  constructor(readonly doc: PDFKit.PDFDocument) {}

  private use(style: TextStyle, fontName: string): void {
    this.doc.font(fontName).fontSize(style.size).fillColor(style.color);
  }

  widthOf(segments: Segment[]): number {
    let width = 0;
    for (const segment of segments) {
      for (const run of fontRuns(segment.text, segment.style.family, segment.style.weight)) {
        this.use(segment.style, run.fontName);
        width += this.doc.widthOfString(run.text);
      }
    }
    return width;
  }

  /**
   * One line of segments on a baseline at y; never wraps. `align` places it in
   * [x, x + width]. Returns the width drawn.
   */
  line(segments: Segment[], x: number, baselineY: number, options: { width?: number; align?: 'left' | 'right' | 'center' } = {}): number {
    const total = this.widthOf(segments);
    const { width = total, align = 'left' } = options;
    let cursor = align === 'right' ? x + width - total : align === 'center' ? x + (width - total) / 2 : x;
    for (const segment of segments) {
      for (const run of fontRuns(segment.text, segment.style.family, segment.style.weight)) {
        this.use(segment.style, run.fontName);
        this.doc.text(run.text, cursor, baselineY, { lineBreak: false, baseline: 'alphabetic' });
        cursor += this.doc.widthOfString(run.text);
      }
    }
    return total;
  }

  /** Height a wrapped paragraph of these segments takes in `width` (measured in the first segment's style). */
  heightOf(segments: Segment[], width: number, lineGap = 1.5): number {
    const first = segments[0];
    this.use(first.style, fontRuns('a', first.style.family, first.style.weight)[0].fontName);
    return this.doc.heightOfString(segments.map((s) => s.text).join(''), { width, lineGap });
  }

  /** A wrapped paragraph with its top at y; returns its height. */
  paragraph(segments: Segment[], x: number, topY: number, width: number, lineGap = 1.5): number {
    const runs = segments.flatMap((segment) =>
      fontRuns(segment.text, segment.style.family, segment.style.weight).map((run) => ({ ...run, style: segment.style })),
    );
    runs.forEach((run, i) => {
      this.use(run.style, run.fontName);
      const continued = i < runs.length - 1;
      if (i === 0) this.doc.text(run.text, x, topY, { width, lineGap, continued });
      else this.doc.text(run.text, { width, lineGap, continued });
    });
    return this.doc.y - topY;
  }

  rule(x1: number, x2: number, y: number, color: string = ink.rule, lineWidth = 0.6): void {
    this.doc.save().moveTo(x1, y).lineTo(x2, y).lineWidth(lineWidth).strokeColor(color).stroke().restore();
  }
}

/** Baseline of a line whose top is at `topY`, matching where pdfkit puts a paragraph's first baseline. */
export function baselineBelow(topY: number, style: TextStyle): number {
  return topY + fontAscender(style.family, style.weight) * style.size;
}
