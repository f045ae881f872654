// Outside check: NIST/ITL Statistical Reference Datasets, nonlinear regression
// (public domain), files copied unmodified into fixtures/nist-strd/.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { levenbergMarquardtFit } from '@shared/measure/fit/levenberg-marquardt-fit';

interface StrdProblem {
  start1: number[];
  start2: number[];
  certifiedParameters: number[];
  certifiedStandardDeviations: number[];
  certifiedResidualSumOfSquares: number;
  x: number[];
  y: number[];
}

function readStrdProblem(fileName: string): StrdProblem {
  const text = readFileSync(path.resolve(__dirname, '../../../fixtures/nist-strd', fileName), 'utf8');
  const lines = text.split(/\r?\n/);
  const start1: number[] = [];
  const start2: number[] = [];
  const certifiedParameters: number[] = [];
  const certifiedStandardDeviations: number[] = [];
  for (const line of lines) {
    const match = /^\s*b\d+\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)\s*$/.exec(line);
    if (!match) continue;
    start1.push(Number(match[1]));
    start2.push(Number(match[2]));
    certifiedParameters.push(Number(match[3]));
    certifiedStandardDeviations.push(Number(match[4]));
  }
  const rssLine = lines.find((l) => l.startsWith('Residual Sum of Squares:'));
  const dataStart = lines.findIndex((l) => /^Data:\s+y\s+x\s*$/.test(l));
  const x: number[] = [];
  const y: number[] = [];
  for (const line of lines.slice(dataStart + 1)) {
    const fields = line.trim().split(/\s+/);
    if (fields.length !== 2) continue;
    y.push(Number(fields[0]));
    x.push(Number(fields[1]));
  }
  return {
    start1,
    start2,
    certifiedParameters,
    certifiedStandardDeviations,
    certifiedResidualSumOfSquares: Number(rssLine!.split(':')[1]),
    x,
    y,
  };
}

/** Log relative error, the number of agreeing significant digits (NIST StRD's own measure). */
function agreeingDigits(estimate: number, certified: number): number {
  const relative = Math.abs(estimate - certified) / Math.abs(certified);
  return relative === 0 ? 16 : -Math.log10(relative);
}

// Model formulas as printed in each file's "Model:" section.
const models: Record<string, (b: number[]) => (x: number) => number> = {
  'Misra1a.dat': (b) => (x) => b[0] * (1 - Math.exp(-b[1] * x)),
  'Gauss1.dat': (b) => (x) =>
    b[0] * Math.exp(-b[1] * x) + b[2] * Math.exp(-((x - b[3]) ** 2) / b[4] ** 2) + b[5] * Math.exp(-((x - b[6]) ** 2) / b[7] ** 2),
  'Gauss3.dat': (b) => (x) =>
    b[0] * Math.exp(-b[1] * x) + b[2] * Math.exp(-((x - b[3]) ** 2) / b[4] ** 2) + b[5] * Math.exp(-((x - b[6]) ** 2) / b[7] ** 2),
};

const observedDigits: string[] = [];

describe('levenbergMarquardtFit against NIST StRD nonlinear regression', () => {
  for (const fileName of ['Misra1a.dat', 'Gauss1.dat', 'Gauss3.dat']) {
    for (const start of ['start1', 'start2'] as const) {
      it(`reproduces the certified parameters and standard deviations of ${fileName} from NIST ${start} to at least 6 significant digits`, () => {
        const problem = readStrdProblem(fileName);
        expect(problem.x.length).toBe(fileName === 'Misra1a.dat' ? 14 : 250);
        const fit = levenbergMarquardtFit({
          x: problem.x,
          y: problem.y,
          model: models[fileName],
          initialParameters: problem[start],
        });
        expect(fit.converged).toBe(true);
        const parameterDigits = fit.parameters.map((v, j) => agreeingDigits(v, problem.certifiedParameters[j]));
        const deviationDigits = fit.standardErrors.map((v, j) => agreeingDigits(v, problem.certifiedStandardDeviations[j]));
        const rssDigits = agreeingDigits(fit.residualSumOfSquares, problem.certifiedResidualSumOfSquares);
        observedDigits.push(
          `${fileName} ${start}: parameters ≥ ${Math.min(...parameterDigits).toFixed(1)}, standard deviations ≥ ${Math.min(...deviationDigits).toFixed(1)}, RSS ${rssDigits.toFixed(1)} digits`,
        );
        expect(Math.min(...parameterDigits)).toBeGreaterThanOrEqual(6);
        expect(Math.min(...deviationDigits)).toBeGreaterThanOrEqual(6);
        expect(rssDigits).toBeGreaterThanOrEqual(8);
        expect(fit.degreesOfFreedom).toBe(problem.x.length - problem.certifiedParameters.length);
      });
    }
  }
  it('prints the agreeing digits reached', () => {
    console.info(observedDigits.join('\n'));
    expect(observedDigits.length).toBe(6);
  });
});
