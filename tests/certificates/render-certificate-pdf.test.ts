/**
 * The rendered certificate, read back with poppler's pdftotext and pdfinfo.
 * Page images go to /tmp/paraxia-cert/ for a person to look at.
 */
import { mkdirSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import QRCode from 'qrcode';
import sharp from 'sharp';
import { beforeAll, describe, expect, it } from 'vitest';
import { renderCertificatePdf } from '../../server/certificates/render-certificate-pdf';
import type { CertificateData } from '../../server/certificates/certificate-data';
import { sha256Hex } from '../../server/certificates/verification-code';
import { makeBudgetData, makeCertificateData, makeDisplacementData, makeMultiConjugateData, makeRevisionTwoData } from './certificate-fixture';
import { flowText, pdfPageCount, pdfPagesText, runPoppler } from './poppler';

const outputFolder = '/tmp/paraxia-cert';

interface Rendered {
  data: CertificateData;
  pdf: Buffer;
  pdfPath: string;
  pages: string[];
  text: string;
  flow: string;
}

async function renderAndRead(name: string, data: CertificateData): Promise<Rendered> {
  const pdf = await renderCertificatePdf(data);
  const pdfPath = path.join(outputFolder, `${name}.pdf`);
  writeFileSync(pdfPath, pdf);
  for (const old of readdirSync(outputFolder).filter((f) => f.startsWith(`${name}-`) && f.endsWith('.png'))) rmSync(path.join(outputFolder, old));
  runPoppler('pdftoppm', ['-r', '70', '-png', pdfPath, path.join(outputFolder, name)]);
  const pages = pdfPagesText(pdfPath);
  const text = pages.join('\n');
  return { data, pdf, pdfPath, pages, text, flow: flowText(text) };
}

/** A printed number back to a JS number (typographic minus included). */
function printedNumber(text: string): number {
  return Number(text.replace('\u2212', '-'));
}

function decimalsOf(text: string): number {
  return (text.split('.')[1] ?? '').length;
}

function significantDigitsOf(text: string): number {
  return text.replace('.', '').replace(/^[-\u2212]?0+/, '').length;
}

/**
 * The value/uncertainty rounding rule of JCGM 100:2008 §7.2.6: U to two
 * significant digits, the value to the same decimal place, each within half
 * a unit of its last printed digit of the input.
 */
function expectRoundedPair(valueText: string, uncertaintyText: string, value: number, uncertainty: number): void {
  const decimals = decimalsOf(uncertaintyText);
  expect(significantDigitsOf(uncertaintyText)).toBe(2);
  expect(decimalsOf(valueText)).toBe(decimals);
  const halfStep = 0.5 * 10 ** -decimals + 1e-12;
  expect(Math.abs(printedNumber(uncertaintyText) - uncertainty)).toBeLessThanOrEqual(halfStep);
  expect(Math.abs(printedNumber(valueText) - value)).toBeLessThanOrEqual(halfStep);
}

let rev1: Rendered;
let rev2: Rendered;
let multi: Rendered;

beforeAll(async () => {
  mkdirSync(outputFolder, { recursive: true });
  rev1 = await renderAndRead('certificate-rev1', makeCertificateData());
  rev2 = await renderAndRead('certificate-rev2', makeRevisionTwoData());
  multi = await renderAndRead('certificate-multi-conjugate', makeMultiConjugateData());
});

describe('renderCertificatePdf', () => {
  it('renderCertificatePdf gives byte-identical PDFs for the same data', async () => {
    const again = await renderCertificatePdf(makeCertificateData());
    expect(again.equals(rev1.pdf)).toBe(true);
    expect(sha256Hex(again)).toBe(sha256Hex(rev1.pdf));
    // Different data must give different bytes, or the check above proves nothing.
    expect(sha256Hex(rev2.pdf)).not.toBe(sha256Hex(rev1.pdf));
  });

  it('renderCertificatePdf writes an A4 PDF of 3 pages whose dates come from the data, not the clock', () => {
    expect(rev1.pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdfPageCount(rev1.pdfPath)).toBe(3);
    expect(rev1.pages).toHaveLength(3);
    const info = runPoppler('pdfinfo', ['-isodates', rev1.pdfPath]);
    expect(info).toMatch(/^Page size:\s+595\.2\d? x 841\.8\d? pts \(A4\)$/m);
    expect(info).toMatch(/^CreationDate:\s+2026-03-12T00:00:00(Z|\+00)/m);
    expect(info).toMatch(/^ModDate:\s+2026-03-12T00:00:00(Z|\+00)/m);
    expect(info).toMatch(/^Title:\s+Calibration certificate QOT-2026-0042 rev 1$/m);
  });

  // Checklist of ISO/IEC 17025:2017 §7.8.2.1 (a)–(o), §7.8.4.1 (calibration
  // certificates) and §7.8.6 (statements of conformity), as methods.md §9 lists them.
  describe('contents required by ISO/IEC 17025:2017 §7.8', () => {
    it('§7.8.2.1 a, d: every page carries the title, the certificate number with its revision and "Page x of N"', () => {
      expect(rev1.pages[0]).toContain('Calibration certificate');
      rev1.pages.forEach((page, i) => {
        expect(page).toContain('QOT-2026-0042 rev 1');
        expect(page).toContain(`Page ${i + 1} of ${rev1.pages.length}`);
      });
    });

    it('§7.8.2.1 b: the laboratory’s name and address', () => {
      const { lab } = rev1.data;
      expect(rev1.pages[0]).toContain(lab.name);
      for (const line of lab.addressLines) expect(rev1.pages[0]).toContain(line);
    });

    it('§7.8.2.1 c, e: the client’s name and address, and where the measurement was made', () => {
      const { client, measurement } = rev1.data;
      expect(rev1.pages[0]).toContain(client.name);
      for (const line of client.addressLines) expect(rev1.pages[0]).toContain(line);
      expect(rev1.pages[0]).toContain(measurement.location!);
    });

    it('§7.8.2.1 f: the method, by name and a plain description', () => {
      expect(rev1.flow).toContain('Finite conjugate. Object and image distances at one finite conjugate');
      expect(multi.flow).toContain('Multiple conjugates. Several object and image conjugates fitted together by least squares');
    });

    it('§7.8.2.1 g: the item’s identifier, serial number, description, part number, nominal focal length and tolerance', () => {
      const page = rev1.pages[0];
      expect(page).toMatch(/Identifier\s+L-2026-0187/);
      expect(page).toMatch(/Serial number\s+PCX100-A-00412/);
      expect(page).toMatch(/Description\s+Plano-convex singlet, 25\.4 mm diameter, crown glass, uncoated/);
      expect(page).toMatch(/Part number\s+PCX-100-25/);
      expect(page).toMatch(/Nominal focal length\s+100 mm converging/);
      // ±1 % of 100 mm gives 99 mm to 101 mm (arithmetic).
      expect(page).toMatch(/Tolerance\s+± 1 % limits 99\.00 mm to 101\.00 mm/);
    });

    it('§7.8.2.1 h, i, j: the dates of receipt, of measurement and of issue', () => {
      const page = rev1.pages[0];
      expect(page).toMatch(/Item received\s+2026-03-04/);
      expect(page).toMatch(/Date of measurement\s+2026-03-10/);
      expect(page).toMatch(/Date of issue\s+2026-03-12/);
      expect(multi.pages[0]).toMatch(/Dates of measurement\s+2026-03-10, 2026-03-11/);
    });

    it('§7.8.2.1 l: the results relate only to the item measured, and the certificate is reproduced only in full', () => {
      expect(rev1.flow).toContain('The results relate only to the item measured');
      expect(rev1.flow).toContain('shall not be reproduced except in full without the written approval of the issuing laboratory');
    });

    it('§7.8.2.1 m, §7.8.4.1 a: the focal length with U, k and the coverage probability, to the stated digits', () => {
      const { results } = rev1.data;
      const row = /Focal length f\s+(\S+) mm\s+U = (\S+) mm\s+expanded, k = (\S+)/.exec(rev1.text);
      expect(row).not.toBeNull();
      expectRoundedPair(row![1], row![2], results.focalLengthMm, results.expandedUncertaintyMm);
      expect(Math.abs(printedNumber(row![3]) - results.coverageFactor)).toBeLessThanOrEqual(0.005);
      expect(rev1.flow).toContain(`multiplied by the coverage factor k = ${row![3]}`);
      expect(rev1.flow).toMatch(/coverage probability of approximately 95 %/);

      const headline = /(\S+) mm U = (\S+) mm/.exec(flowText(rev1.pages[0].split('Measured focal length')[1]));
      expect(headline![1]).toBe(row![1]);
      expect(headline![2]).toBe(row![2]);
    });

    it('§7.8.2.1 m: optical power, back focal distance and principal-plane offsets with their uncertainties and units', () => {
      const { results } = rev1.data;
      const power = /Optical power P = 1000 \/ f\s+(\S+) D\s+U = (\S+) D/.exec(rev1.text);
      expectRoundedPair(power![1], power![2], results.opticalPowerDioptres, results.opticalPowerExpandedUncertaintyDioptres);
      const bfd = /Back focal distance\s+(\S+) mm\s+u = (\S+) mm\s+standard, k = 1/.exec(rev1.text);
      expectRoundedPair(bfd![1], bfd![2], results.backFocalDistanceMm!, results.backFocalDistanceStandardUncertaintyMm!);

      const planes = makeMultiConjugateData().results.principalPlanes!;
      const front = /Front principal-plane offset h\s+(\S+) mm\s+u = (\S+) mm/.exec(multi.text);
      expectRoundedPair(front![1], front![2], planes.frontOffsetMm, planes.frontOffsetStandardUncertaintyMm!);
      const rear = /Rear principal-plane offset h′\s+(\S+) mm\s+u = (\S+) mm/.exec(multi.text);
      expectRoundedPair(rear![1], rear![2], planes.rearOffsetMm, planes.rearOffsetStandardUncertaintyMm!);
    });

    it('§7.8.2.1 m: best focus and magnification for every sweep', () => {
      for (const rendered of [rev1, multi]) {
        for (const sweep of rendered.data.results.sweeps) {
          const escaped = sweep.label.replace(/[()]/g, '\\$&');
          const row = new RegExp(`${escaped}\\s+(\\S+) mm\\s+(\\S+) mm\\s+(\\S+)`).exec(rendered.text);
          expect(row, sweep.label).not.toBeNull();
          expectRoundedPair(row![1], row![2], sweep.focusCurve.bestFocusPositionMm, sweep.focusCurve.bestFocusStandardUncertaintyMm);
          expect(Math.abs(printedNumber(row![3]) - sweep.magnifications[0])).toBeLessThanOrEqual(0.5e-5 * sweep.magnifications[0]);
        }
      }
    });

    it('§7.8.4.1 a: the uncertainty budget lists every source with its contribution in mm', () => {
      for (const budgetRow of rev1.data.results.uncertaintyBudget) {
        const words = budgetRow.source.split(' ').map((w) => w.replace(/[()]/g, '\\$&'));
        // A long source name may wrap in its cell; its first two words stay on the row's line.
        const row = new RegExp(`${words.slice(0, 2).join(' ')}.*?\\s(\\S+) mm\\s+(\\S+) %`).exec(rev1.text);
        expect(row, budgetRow.source).not.toBeNull();
        const contribution = printedNumber(row![1]);
        expect(significantDigitsOf(row![1])).toBe(2);
        expect(Math.abs(contribution - budgetRow.contributionMm)).toBeLessThanOrEqual(0.5 * 10 ** -decimalsOf(row![1]) + 1e-12);
        expect(Math.abs(printedNumber(row![2]) - 100 * budgetRow.varianceShare)).toBeLessThanOrEqual(0.05 + 1e-9);
      }
      expect(rev1.flow).toMatch(/Combined standard uncertainty u\(f\) = 0\.049 mm/);
    });

    it('§7.8.4.1 b: the environmental conditions with units', () => {
      expect(rev1.pages[0]).toMatch(/Ambient temperature\s+20\.6 °C/);
      expect(rev1.pages[0]).toMatch(/Relative humidity\s+41 %/);
    });

    it('§7.8.4.1 c: each piece of equipment with its calibration reference and due date, and the override with its reason', () => {
      for (const entry of rev1.data.equipment) {
        expect(rev1.text).toMatch(new RegExp(`${entry.identifier}\\s.*${entry.calibrationReference}\\s+${entry.calibrationDueDate}`));
      }
      expect(rev1.flow).toContain(
        'RS-01 was used after its calibration due date 2026-02-28 under an override recorded by Dr Imre Salvatierra on 2026-03-09. Reason: Scale checked against gauge block set GB-2',
      );
    });

    it('§7.8.6: the decision rule and the statement of conformity, in words', () => {
      expect(rev1.flow).toContain('Decision rule Guarded acceptance, guard band w = U');
      expect(rev1.flow).toContain('Acceptance zone 99.10 mm to 100.90 mm');
      expect(rev1.flow).toContain('Conforms. The measured focal length 100.23 mm lies inside the tolerance limits 99.00 mm to 101.00 mm by at least U = 0.10 mm.');
    });

    it('§7.8.2.1 o: who performed the measurement and who authorised the certificate, with roles and dates', () => {
      expect(rev1.text).toContain('Agnieszka Wróbel-Łęcka');
      expect(rev1.text).toMatch(/Bench technician 2026-03-10/);
      expect(rev1.text).toContain('Dr Imre Salvatierra');
      expect(rev1.text).toMatch(/Senior metrologist, reviewer 2026-03-12/);
      expect(multi.text).toContain('Oskar Lindqvist-Mbeki');
    });
  });

  it('renderCertificatePdf prints the responsibility statement and the safety caution in the footer of every page', () => {
    for (const page of rev1.pages) {
      const flow = flowText(page);
      expect(flow).toContain(
        'This certificate is Quillmere Optical Test Laboratory’s own statement. Conformity decisions, accreditation and traceability claims remain the laboratory’s responsibility under its quality system and local regulations.',
      );
      expect(flow).toContain('Never look into a collimated beam or a laser; keep a focusing lens away from sunlight and anything flammable; follow the laser class of the source and local rules.');
    }
  });

  it('renderCertificatePdf prints the verification code and its public address', () => {
    expect(rev1.text).toContain('7KQ4-MX2R-9TWH');
    expect(rev1.text).toContain('https://verify.quillmere-optics.example/verify/7KQ4-MX2R-9TWH');
    const images = runPoppler('pdfimages', ['-list', rev1.pdfPath]);
    // One image in the whole file (its alpha channel aside): the QR code, square, on the last page.
    const rows = images.split('\n').slice(2).map((l) => l.trim().split(/\s+/)).filter((cells) => cells[2] === 'image');
    expect(rows).toHaveLength(1);
    const [pageNumber, , , width, height] = rows[0];
    expect(width).toBe(height);
    expect(Number(pageNumber)).toBe(rev1.pages.length);
  });

  it('the embedded QR image holds, module for module, the symbol qrcode makes for the verification address', async () => {
    const url = 'https://verify.quillmere-optics.example/verify/7KQ4-MX2R-9TWH';
    const prefix = path.join(outputFolder, 'certificate-rev1-qr');
    runPoppler('pdfimages', ['-png', '-f', '3', '-l', '3', rev1.pdfPath, prefix]);
    const { data, info } = await sharp(`${prefix}-000.png`).greyscale().raw().toBuffer({ resolveWithObject: true });
    // qrcode (a general-purpose QR encoder on npm) is the reference for which modules are dark.
    const symbol = QRCode.create(url, { errorCorrectionLevel: 'M' }).modules;
    const modulePx = info.width / symbol.size;
    expect(Number.isInteger(modulePx)).toBe(true);
    let mismatches = 0;
    for (let row = 0; row < symbol.size; row += 1) {
      for (let column = 0; column < symbol.size; column += 1) {
        const x = Math.floor((column + 0.5) * modulePx);
        const y = Math.floor((row + 0.5) * modulePx);
        const dark = data[y * info.width + x] < 128;
        if (dark !== Boolean(symbol.get(row, column))) mismatches += 1;
      }
    }
    expect(mismatches).toBe(0);
    // A different address gives a different symbol, so the comparison can fail.
    expect(QRCode.create(`${url}X`, { errorCorrectionLevel: 'M' }).modules.data).not.toEqual(symbol.data);
  });

  it('a revision-2 certificate names the revision it replaces and the reason', () => {
    expect(rev2.flow).toContain('This revision replaces revision 1, which is withdrawn. Reason: The client’s order reference was printed wrongly.');
    rev2.pages.forEach((page) => expect(page).toContain('QOT-2026-0042 rev 2'));
    expect(rev1.flow).not.toContain('This revision replaces');
  });

  it('renderCertificatePdf draws three sweeps as small multiples and still fits 3 pages', () => {
    expect(pdfPageCount(multi.pdfPath)).toBe(3);
    const titles = multi.text.split('\n').find((line) => line.includes('Sweep 1 (object at 300 mm)') && line.includes('Sweep 3 (object at 550 mm)'));
    expect(titles).toBeDefined();
  });

  it('renderCertificatePdf lists and draws both sharp positions of a displacement sweep', async () => {
    const rendered = await renderAndRead('certificate-displacement', makeDisplacementData());
    expect(rendered.flow).toContain('Displacement (Bessel). Fixed object-to-sensor distance D');
    expect(rendered.text).toMatch(/Sweep 1 \(D = 500 mm\), sharp position 1\s+182\.100 mm\s+0\.021 mm\s+1\.7462/);
    expect(rendered.text).toMatch(/Sweep 1 \(D = 500 mm\), sharp position 2\s+317\.900 mm\s+0\.024 mm\s+0\.57270/);
    expect(rendered.text).toContain('best focus 182.100 mm');
    expect(rendered.text).toContain('best focus 317.900 mm');
    expect(rendered.text).not.toContain('Back focal distance');
  });

  it('renderCertificatePdf words the other two decisions and marks an undecided result', async () => {
    const data = makeCertificateData();
    // 100.95 mm lies within U ≈ 0.10 mm of the 101 mm limit: guarded acceptance cannot decide.
    const undecided = structuredClone(data);
    undecided.results.focalLengthMm = 100.95;
    undecided.results.opticalPowerDioptres = 1000 / 100.95;
    undecided.conformity.decision = 'undecided';
    const rendered = await renderAndRead('certificate-undecided', undecided);
    expect(rendered.flow).toContain('Undecided. The measured focal length 100.95 mm lies within U = 0.10 mm of a tolerance limit');

    const outside = structuredClone(data);
    outside.results.focalLengthMm = 101.4;
    outside.results.opticalPowerDioptres = 1000 / 101.4;
    outside.conformity = { ...outside.conformity, rule: 'simple', decision: 'does-not-conform' };
    const text = flowText(pdfPagesText((await renderAndRead('certificate-outside', outside)).pdfPath).join('\n'));
    expect(text).toContain('Does not conform. The measured focal length 101.40 mm lies outside the tolerance limits 99.00 mm to 101.00 mm.');
    expect(text).toContain('Decision rule Simple acceptance');
  });

  it('renderCertificatePdf keeps a budget number with its unit and a 16-character equipment identifier each on one line', async () => {
    const rendered = await renderAndRead('certificate-long-budget', makeBudgetData(10));
    const lines = rendered.text.split('\n');
    const contributionLines = lines.filter((line) => /^\s*rail reading error at/.test(line));
    expect(contributionLines).toHaveLength(3);
    for (const line of contributionLines) expect(line).toMatch(/0\.00072 mm\s+\S+ %/);
    expect(lines.some((line) => line.includes('CAM-794f/cfa4fe'))).toBe(true);
    expect(lines.some((line) => line.includes('RAIL-7b87/f39ed3'))).toBe(true);
  });

  it('renderCertificatePdf never leaves the combined standard uncertainty on a page without the budget’s last two rows', async () => {
    const budgetRowLine = / mm\s+\d+\.\d %\s*$/;
    const summaryPages = new Set<number>();
    for (let rowCount = 1; rowCount <= 20; rowCount += 1) {
      const pdfPath = path.join(outputFolder, 'certificate-budget-break.pdf');
      writeFileSync(pdfPath, await renderCertificatePdf(makeBudgetData(rowCount)));
      const pages = pdfPagesText(pdfPath);
      const rowsPerPage = pages.map((page) => page.split('\n').filter((line) => budgetRowLine.test(line)).length);
      const summaryPage = pages.findIndex((page) => page.includes('Combined standard uncertainty u(f)'));
      summaryPages.add(summaryPage);
      expect(rowsPerPage.reduce((a, b) => a + b, 0), `${rowCount} rows`).toBe(rowCount);
      expect(rowsPerPage[summaryPage], `${rowCount} rows`).toBeGreaterThanOrEqual(Math.min(2, rowCount));
      expect(rowsPerPage.slice(summaryPage + 1).every((n) => n === 0), `${rowCount} rows`).toBe(true);
    }
    // The counts must carry the budget's end across a page boundary, or the check proves nothing.
    expect(summaryPages.size).toBeGreaterThan(1);
  });
});
