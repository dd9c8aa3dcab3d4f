import { describe, it, expect } from 'vitest';
import { getIon, ION_NAMES, hundsRuleTerm, landeG, type Ion } from '@multiplet/physics/ions';
import { stevensOperator } from '@multiplet/physics/cef';
import { wigner3j, clebschGordan } from './wignerForTests';

/**
 * Published Hund's-rule terms and Landé factors of the R3+ ions (Abragam & Bleaney 1970; Jensen &
 * Mackintosh, Rare Earth Magnetism (1991); from memory: the term symbols and g_J fractions are textbook
 * values recalled here).
 */
const PUBLISHED: Record<string, { term: string; J: number; gJ: number }> = {
  'Ce3+': { term: '2F', J: 5 / 2, gJ: 6 / 7 },
  'Pr3+': { term: '3H', J: 4, gJ: 4 / 5 },
  'Nd3+': { term: '4I', J: 9 / 2, gJ: 8 / 11 },
  'Pm3+': { term: '5I', J: 4, gJ: 3 / 5 },
  'Sm3+': { term: '6H', J: 5 / 2, gJ: 2 / 7 },
  'Eu3+': { term: '7F', J: 0, gJ: 0 },
  'Gd3+': { term: '8S', J: 7 / 2, gJ: 2 },
  'Tb3+': { term: '7F', J: 6, gJ: 3 / 2 },
  'Dy3+': { term: '6H', J: 15 / 2, gJ: 4 / 3 },
  'Ho3+': { term: '5I', J: 8, gJ: 5 / 4 },
  'Er3+': { term: '4I', J: 15 / 2, gJ: 6 / 5 },
  'Tm3+': { term: '3H', J: 6, gJ: 7 / 6 },
  'Yb3+': { term: '2F', J: 7 / 2, gJ: 8 / 7 },
};
const L_LETTERS = 'SPDFGHI';

/**
 * Stevens factors as published (Stevens 1952; Hutchings 1964, Stevens-factor table; from memory). Several are also quoted in the
 * brief for this module (Dy3+: α = −2/315, β = −8/135135, γ = 4/3864861).
 */
const PUBLISHED_STEVENS: Record<string, [number, number, number]> = {
  'Ce3+': [-2 / 35, 2 / 315, 0],
  'Dy3+': [-2 / 315, -8 / 135135, 4 / 3864861],
  'Ho3+': [-1 / 450, -1 / 30030, -5 / 3864861],
  'Er3+': [4 / 1575, 2 / 45045, 8 / 3864861],
  'Yb3+': [2 / 63, -2 / 1155, 4 / 27027],
  'Tb3+': [-1 / 99, 2 / 16335, -1 / 891891],
  'Pr3+': [-52 / 2475, -4 / 5445, 272 / 4459455],
  'Nd3+': [-7 / 1089, -136 / 467181, -1615 / 42513471],
};

/**
 * Independent computation of θ_k (k = 2, 4, 6) for the Hund's-rule ground state, not using the table:
 * |L, M_L = L; S, M_S = S⟩ is one Slater determinant (m_l = 3, 2, … spin up, then spin down), so
 * ⟨Σ_i C^k_0(i)⟩ there is a sum of one-electron ⟨3 m_l|C^k_0|3 m_l⟩ = (−1)^{m_l} 7 (3 k 3; 0 0 0)(3 k 3; −m_l 0 m_l)
 * (Edmonds 1957, ch. 5). Wigner–Eckart carries this to every M_L (∝ the diagonal of O_k^0(L)) and Clebsch–Gordan
 * coupling to |J, J⟩. Finally Σ_i p_k0(r_i) = θ_k ⟨r^k⟩ O_k^0 with p_20 = 2r²C^2_0, p_40 = 8r⁴C^4_0,
 * p_60 = 16r⁶C^6_0 (Legendre polynomials, Abramowitz & Stegun ch. 22).
 */
function stevensFactorFromDeterminant(ion: Ion, k: number): number {
  const { nf, S, L, J } = ion;
  if (J === 0 || L === 0) return 0;
  const oneElectron = (ml: number) => (ml % 2 === 0 ? 1 : -1) * 7 * wigner3j(3, k, 3, 0, 0, 0) * wigner3j(3, k, 3, -ml, 0, ml);
  let topOrbital = 0;
  const up = Math.min(nf, 7), down = nf - up;
  for (let i = 0; i < up; i++) topOrbital += oneElectron(3 - i);
  for (let i = 0; i < down; i++) topOrbital += oneElectron(3 - i);
  const diagL = (ML: number) => stevensOperator(L, k, 0).re[Math.round(L - ML) * (2 * L + 1) + Math.round(L - ML)];
  if (2 * L < k) return 0;
  const scale = topOrbital / diagL(L);
  let inJ = 0;
  for (let ML = -L; ML <= L; ML++) {
    const MS = J - ML;
    if (Math.abs(MS) > S + 1e-9) continue;
    inJ += clebschGordan(L, ML, S, MS, J, J) ** 2 * scale * diagL(ML);
  }
  if (2 * J < k) return 0;
  const pk = { 2: 2, 4: 8, 6: 16 }[k]!;
  return (pk * inJ) / stevensOperator(J, k, 0).re[0];
}

describe('ion table', () => {
  it('lists Ce3+ … Yb3+ (13 ions)', () => {
    expect(ION_NAMES).toEqual(['Ce3+', 'Pr3+', 'Nd3+', 'Pm3+', 'Sm3+', 'Eu3+', 'Gd3+', 'Tb3+', 'Dy3+', 'Ho3+', 'Er3+', 'Tm3+', 'Yb3+']);
  });

  it('Hund’s rules and Landé g_J match the published term symbols and g_J (Abragam & Bleaney 1970)', () => {
    for (const name of ION_NAMES) {
      const ion = getIon(name);
      const p = PUBLISHED[name];
      expect(`${2 * ion.S + 1}${L_LETTERS[ion.L]}`, name).toBe(p.term);
      expect(ion.J, name).toBe(p.J);
      expect(ion.gJ, name).toBeCloseTo(p.gJ, 14);
      expect(ion.kramers, name).toBe(ion.nf % 2 === 1);
    }
    expect(hundsRuleTerm(0)).toEqual({ S: 0, L: 0, J: 0 });
    expect(hundsRuleTerm(14)).toEqual({ S: 0, L: 0, J: 0 });
    expect(landeG(0.5, 0, 0.5)).toBe(2);
  });

  it('Stevens factors equal the published fractions (Stevens 1952; Hutchings 1964, Stevens-factor table)', () => {
    for (const [name, [a, b, c]] of Object.entries(PUBLISHED_STEVENS)) {
      const ion = getIon(name);
      expect(ion.stevens.alpha, name).toBeCloseTo(a, 15);
      expect(ion.stevens.beta, name).toBeCloseTo(b, 15);
      expect(ion.stevens.gamma, name).toBeCloseTo(c, 16);
    }
  });

  it('every tabulated Stevens factor agrees with the independent Slater-determinant computation to 1e-12', () => {
    for (const name of ION_NAMES) {
      const ion = getIon(name);
      const table = [ion.stevens.alpha, ion.stevens.beta, ion.stevens.gamma];
      [2, 4, 6].forEach((k, i) => {
        const computed = stevensFactorFromDeterminant(ion, k);
        expect(Math.abs(computed - table[i]), `${name} θ_${k}: computed ${computed}, table ${table[i]}`).toBeLessThanOrEqual(1e-12 * Math.abs(table[i]) + 1e-18);
      });
    }
  });

  it('radial integrals decrease across the series (lanthanide contraction; Freeman & Desclaux 1979)', () => {
    const ions = ION_NAMES.map(getIon);
    for (let i = 1; i < ions.length; i++) {
      expect(ions[i].radial.r2).toBeLessThan(ions[i - 1].radial.r2);
      expect(ions[i].radial.r4).toBeLessThan(ions[i - 1].radial.r4);
      expect(ions[i].radial.r6).toBeLessThan(ions[i - 1].radial.r6);
    }
    // from memory: Freeman & Desclaux (1979) Dy3+ ⟨r²⟩ = 0.7814 a0²
    expect(getIon('Dy3+').radial.r2).toBeCloseTo(0.7814, 4);
  });

  it('accepts name variants and rejects unknown ions with an InputError naming the field', () => {
    expect(getIon('Dy').name).toBe('Dy3+');
    expect(getIon('dy3+').name).toBe('Dy3+');
    expect(getIon(' YB3+ ').name).toBe('Yb3+');
    expect(() => getIon('Xx3+')).toThrow(/^ion: got "Xx3\+", expected one of Ce3\+, Pr3\+/);
    expect(() => getIon('Dy2+')).toThrow(/ion/);
  });
});
