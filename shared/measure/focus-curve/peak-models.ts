/**
 * Peaked models of focus measure against position, parameters
 * [baseline c, amplitude A, peak position z0, width w]:
 * - gaussian:   c + A·exp(−(z − z0)²/(2w²))      (w is the standard deviation)
 * - lorentzian: c + A / (1 + ((z − z0)/w)²)       (w is the half-width at half maximum)
 */
export type FocusPeakModelName = 'gaussian' | 'lorentzian';

export interface FocusPeakModel {
  name: FocusPeakModelName;
  evaluate: (parameters: number[]) => (z: number) => number;
  jacobian: (parameters: number[]) => (z: number) => number[];
  /** Converts a Gaussian standard deviation into this model's width parameter (same half-maximum). */
  widthFromGaussianSigma: (sigma: number) => number;
}

const gaussian: FocusPeakModel = {
  name: 'gaussian',
  evaluate:
    ([c, a, z0, w]) =>
    (z) =>
      c + a * Math.exp(-((z - z0) ** 2) / (2 * w * w)),
  jacobian:
    ([, a, z0, w]) =>
    (z) => {
      const d = z - z0;
      const e = Math.exp(-(d * d) / (2 * w * w));
      return [1, e, (a * e * d) / (w * w), (a * e * d * d) / (w * w * w)];
    },
  widthFromGaussianSigma: (sigma) => sigma,
};

const lorentzian: FocusPeakModel = {
  name: 'lorentzian',
  evaluate:
    ([c, a, z0, w]) =>
    (z) =>
      c + a / (1 + ((z - z0) / w) ** 2),
  jacobian:
    ([, a, z0, w]) =>
    (z) => {
      const u = (z - z0) / w;
      const l = 1 / (1 + u * u);
      return [1, l, (2 * a * u * l * l) / w, (2 * a * u * u * l * l) / w];
    },
  widthFromGaussianSigma: (sigma) => sigma * Math.sqrt(2 * Math.LN2),
};

export const focusPeakModels: Record<FocusPeakModelName, FocusPeakModel> = { gaussian, lorentzian };
