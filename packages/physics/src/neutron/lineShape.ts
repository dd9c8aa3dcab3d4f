/**
 * Unit-area line shapes in energy (1/meV) with a full width at half maximum in meV:
 *   Gaussian  G(x; Γ) = (2/Γ) √(ln2/π) exp(−4 ln2 x²/Γ²)
 *   Lorentzian L(x; Γ) = (Γ/2π) / (x² + Γ²/4)
 *   pseudo-Voigt ≈ Voigt(Gaussian Γ_G ⊗ Lorentzian Γ_L): η L(x; Γ) + (1 − η) G(x; Γ) with Γ and η from
 *   Thompson, Cox & Hastings, J. Appl. Cryst. 20, 79 (1987), eqs. 3–4.
 *
 * @example lineShape('pseudo-voigt', 0.1, 0.5, 0.2) // resolution 0.5 meV, intrinsic 0.2 meV
 * See also: neutronSpectrum
 */
export type LineShapeKind = 'gaussian' | 'lorentzian' | 'pseudo-voigt';

export const LINE_SHAPES: readonly LineShapeKind[] = ['gaussian', 'lorentzian', 'pseudo-voigt'];

const LN2 = Math.log(2);

function gaussian(x: number, fwhm: number): number {
  return (2 / fwhm) * Math.sqrt(LN2 / Math.PI) * Math.exp((-4 * LN2 * x * x) / (fwhm * fwhm));
}

function lorentzian(x: number, fwhm: number): number {
  return fwhm / (2 * Math.PI) / (x * x + (fwhm * fwhm) / 4);
}

/**
 * Value at offset x (meV) of a unit-area line with Gaussian (resolution) FWHM `gaussianFwhmMeV` and Lorentzian
 * (intrinsic) FWHM `lorentzianFwhmMeV`. 'gaussian' combines both widths in quadrature into one Gaussian;
 * 'lorentzian' adds them into one Lorentzian; 'pseudo-voigt' approximates their convolution.
 */
export function lineShape(kind: LineShapeKind, xMeV: number, gaussianFwhmMeV: number, lorentzianFwhmMeV = 0): number {
  switch (kind) {
    case 'gaussian':
      return gaussian(xMeV, Math.hypot(gaussianFwhmMeV, lorentzianFwhmMeV));
    case 'lorentzian':
      return lorentzian(xMeV, gaussianFwhmMeV + lorentzianFwhmMeV);
    case 'pseudo-voigt': {
      const g = gaussianFwhmMeV;
      const l = lorentzianFwhmMeV;
      if (l === 0) return gaussian(xMeV, g);
      if (g === 0) return lorentzian(xMeV, l);
      const width = (g ** 5 + 2.69269 * g ** 4 * l + 2.42843 * g ** 3 * l ** 2 + 4.47163 * g ** 2 * l ** 3 + 0.07842 * g * l ** 4 + l ** 5) ** 0.2;
      const ratio = l / width;
      const eta = 1.36603 * ratio - 0.47719 * ratio ** 2 + 0.11116 * ratio ** 3;
      return eta * lorentzian(xMeV, width) + (1 - eta) * gaussian(xMeV, width);
    }
  }
}
