/**
 * Conversion between Stevens parameters B_n^m (meV; DEVELOPERS.md § Conventions) and Wybourne parameters B^k_q (meV).
 *
 * Wybourne convention (B. G. Wybourne, Spectroscopic Properties of Rare Earths (1965)): H = Σ_{k,q} B^k_q C^k_q with
 * Racah's normalised spherical tensors C^k_q = sqrt(4π/(2k+1)) Y_k^q (Condon–Shortley phases) and
 * B^k_{−q} = (−1)^q (B^k_q)* so that H is Hermitian. Keys: 'B43' holds Re B^4_3, 'B4-3' holds Im B^4_3 (q > 0),
 * 'B40' holds B^4_0. The radial integral ⟨r^k⟩ is inside both kinds of parameters.
 *
 * Derivation (our own, from the polynomial forms): r^k C^k_q = (−1)^q sqrt((k−q)!/(k+q)!) g_kq (x+iy)^q p_kq(z, r)
 * where p_kq is the Stevens polynomial and g_kq the Legendre scale factor (cef/stevensOperatorFromTensor.ts). Pairing
 * q with −q and replacing polynomials by θ_k O_k^q gives
 *   B_k^0 (Stevens) = θ_k λ_k0 B^k_0,
 *   B_k^q  = (−1)^q 2 θ_k λ'_kq Re B^k_q,    B_k^{−q} = −(−1)^q 2 θ_k λ'_kq Im B^k_q,   λ'_kq = sqrt((k−q)!/(k+q)!) g_kq,
 * with λ_kq = 2 λ'_kq (q > 0), λ_k0 = g_k0: the magnitudes are the familiar conversion factors (λ20 = 1/2, λ22 = √6/2,
 * λ43 = √35/2, λ66 = √231/16, …; A. J. Kassman (1970); from memory, compared in the tests).
 * The signs for odd q and for the imaginary parts follow from the Condon–Shortley phase; other texts differ in them.
 */
import { InputError } from '../errors';
import { stevensFactor, type Ion } from '../ions';
import type { CefParameters } from './cefHamiltonian';
import { parameterKey, requireParameterKey } from './parameterKeys';
import { legendreDerivativeScale } from './stevensOperatorFromTensor';

function factorial(n: number): number {
  let r = 1;
  for (let i = 2; i <= n; i++) r *= i;
  return r;
}

/**
 * The signed factor c_kq with B_k^q (Stevens) = θ_k · c_kq · (Wybourne component for the same key).
 * @example stevensWybourneFactor(2, 2) // √6/2
 */
export function stevensWybourneFactor(k: number, q: number): number {
  const a = Math.abs(q);
  if (a === 0) return legendreDerivativeScale(k, 0);
  const lambda = 2 * Math.sqrt(factorial(k - a) / factorial(k + a)) * legendreDerivativeScale(k, a);
  const phase = a % 2 === 0 ? 1 : -1;
  return q > 0 ? phase * lambda : -phase * lambda;
}

function convert(parameters: Record<string, number>, ion: Ion, toWybourne: boolean, field: string): Record<string, number> {
  if (!ion || typeof ion !== 'object' || typeof ion.J !== 'number') throw new InputError('ion', ion, 'an Ion from getIon');
  if (parameters === null || typeof parameters !== 'object') throw new InputError(field, parameters, 'an object of crystal-field parameters');
  const out: Record<string, number> = {};
  for (const [key, value] of Object.entries(parameters)) {
    const { n, m } = requireParameterKey(key, field);
    if (typeof value !== 'number' || !Number.isFinite(value)) throw new InputError(`${field}.${key}`, value, 'a finite number (meV)');
    const factor = stevensFactor(ion, n) * stevensWybourneFactor(n, m);
    if (toWybourne) {
      if (factor === 0) {
        if (value !== 0)
          throw new InputError(`${field}.${key}`, value, `0: the Stevens factor θ_${n} of ${ion.name} is zero, so ${key} has no Wybourne equivalent`);
        continue;
      }
      out[parameterKey(n, m)] = value / factor;
    } else {
      out[parameterKey(n, m)] = value * factor;
    }
  }
  return out;
}

/**
 * Stevens parameters (meV) → Wybourne parameters (meV) for an ion (uses its θ_k). Keys as described above.
 * @example stevensToWybourne({ B20: -0.2 }, getIon('Dy3+')) // { B20: 63 }  (−0.2 / (α_J · ½))
 * See also: wybourneToStevens
 */
export function stevensToWybourne(parametersMeV: CefParameters, ion: Ion): Record<string, number> {
  return convert(parametersMeV as Record<string, number>, ion, true, 'B');
}

/**
 * Wybourne parameters (meV) → Stevens parameters (meV) for an ion.
 * @example wybourneToStevens({ B20: 63 }, getIon('Dy3+')) // { B20: −0.2 }
 * See also: stevensToWybourne
 */
export function wybourneToStevens(wybourneMeV: Readonly<Record<string, number>>, ion: Ion): CefParameters {
  return Object.freeze(convert(wybourneMeV as Record<string, number>, ion, false, 'wybourne'));
}
