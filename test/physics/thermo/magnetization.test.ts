import { describe, expect, it } from 'vitest';
import { magnetization } from '@multiplet/physics/thermo/magnetization';
import { vanVleckSusceptibility } from '@multiplet/physics/thermo/susceptibility';
import { AVOGADRO_PER_MOL, BOHR_MAGNETON_J_PER_T, BOHR_MAGNETON_MEV_PER_T, BOLTZMANN_MEV_PER_K } from '@multiplet/physics/units';
import { createTask } from '@multiplet/physics/progress';
import { lebedevGrid } from '@multiplet/physics/quadrature';
import { InputError, CancelledError } from '@multiplet/physics/errors';

/** Brillouin function B_J(x) (Kittel, Introduction to Solid State Physics, ch. 14; Blundell, Magnetism in Condensed Matter, eq. 2.44). */
function brillouin(J: number, x: number): number {
  const a = (2 * J + 1) / (2 * J), b = 1 / (2 * J);
  const coth = (y: number) => 1 / Math.tanh(y);
  return a * coth(a * x) - b * coth(b * x);
}

const dyLike = { J: 7.5, gJ: 4 / 3 };
// A strong axial field: ground doublet |±15/2⟩ with the next level 3·14·|B20| = 42 000 meV away, i.e. a pure Ising
// moment m = g_J J = 10 μB (the transverse Van Vleck response adds ≈ 6e-6 of m along the field at 3 T).
const ising = { ...dyLike, parametersMeV: { B20: -1000 } };

describe('magnetization', () => {
  it('without a crystal field equals g_J J B_J(x), x = g_J μB J B/k_BT, to 1e-10 (Brillouin; Kittel ch. 14)', () => {
    const ion = { J: 3.5, gJ: 2, parametersMeV: {} };
    const temperatures = [0.7, 4, 50];
    const fields = [0.05, 0.5, 3, 9];
    for (const direction of [[0, 0, 1], [1, 2, -0.5]] as const) {
      const r = magnetization(ion, { temperaturesK: temperatures, fieldsT: fields, direction: [...direction] as [number, number, number] });
      temperatures.forEach((t, i) =>
        fields.forEach((b, j) => {
          const x = (ion.gJ * BOHR_MAGNETON_MEV_PER_T * ion.J * b) / (BOLTZMANN_MEV_PER_K * t);
          expect(Math.abs(r.magnetizationMuB[i][j] - ion.gJ * ion.J * brillouin(ion.J, x))).toBeLessThan(1e-10);
        }),
      );
    }
  });

  it('saturated Ising moment on the four ⟨111⟩ axes: m/√3 along [001], m/2 along [111], m/√6 along [110] (common practice)', () => {
    const m = 10;
    const cases: Array<[[number, number, number], number]> = [
      [[0, 0, 1], m / Math.sqrt(3)],
      [[1, 1, 1], m / 2],
      [[1, 1, 0], m / Math.sqrt(6)],
    ];
    for (const [direction, expected] of cases) {
      const r = magnetization(ising, { temperaturesK: [0.5], fieldsT: [3], direction, sites: 'pyrochlore' });
      expect(r.magnetizationMuB[0][0] / expected).toBeCloseTo(1, 4);
    }
  });

  it('powder average of a saturated Ising moment is m/2 (common practice), for one site and for the four pyrochlore frames', () => {
    for (const sites of ['single', 'pyrochlore'] as const) {
      const r = magnetization(ising, { temperaturesK: [0.5], fieldsT: [20], direction: 'powder', sites, powder: { degree: 131 } });
      expect(Math.abs(r.magnetizationMuB[0][0] / 10 - 0.5)).toBeLessThan(2e-4);
    }
  });

  it('powder by tolerance stops when successive degrees agree', () => {
    const ion = { ...dyLike, parametersMeV: { B20: -0.3, B40: 0.002, B43: 0.01 } };
    const r = magnetization(ion, { temperaturesK: [5], fieldsT: [0.5, 2, 7], direction: 'powder', powder: { tolerance: 1e-5 } });
    expect(r.powder!.converged).toBe(true);
    expect(r.powder!.relativeChange).toBeLessThanOrEqual(1e-5);
    const reference = magnetization(ion, { temperaturesK: [5], fieldsT: [0.5, 2, 7], direction: 'powder', powder: { degree: 131 } });
    r.magnetizationMuB[0].forEach((v, j) => expect(Math.abs(v / reference.magnetizationMuB[0][j] - 1)).toBeLessThan(1e-4));
    // More than 12 fields: the degree is searched on 12 of them, then the whole curve is computed at that degree.
    const many = Array.from({ length: 30 }, (_, i) => 0.25 * (i + 1));
    const searched = magnetization(ion, { temperaturesK: [5], fieldsT: many, direction: 'powder', powder: { tolerance: 1e-5 } });
    const atDegree = magnetization(ion, { temperaturesK: [5], fieldsT: many, direction: 'powder', powder: { degree: searched.powder!.degree } });
    expect(Array.from(searched.magnetizationMuB[0])).toEqual(Array.from(atDegree.magnetizationMuB[0]));
  });

  it('symmetry reduction (time reversal × rotations leaving H_CEF invariant) gives the plain inversion-half result', () => {
    const cases: Array<[Record<string, number>, number]> = [
      [{ B20: -0.3, B40: 0.002, B43: 0.01, B60: 1e-5, B63: -2e-4, B66: 3e-4 }, 12], // D3d, z ∥ C3, y ∥ C2
      [{ B40: 0.002, B44: 0.01, B60: 1e-5, B64: -21e-5 }, 48], // cubic (O_h) with z ∥ [001]
      [{ B20: -0.3, B22: 0.05, B40: 0.002, B42: 0.003, B44: -0.004 }, 8], // orthorhombic D2h
      [{ B20: -0.3, B21: 0.05, B2m2: 0.02, B43: 0.01, B4m1: 0.003 }, 2], // no rotation symmetry: time reversal only
    ];
    for (const [parametersMeV, operations] of cases) {
      const ion = { ...dyLike, parametersMeV: Object.fromEntries(Object.entries(parametersMeV).map(([k, v]) => [k.replace('m', '-'), v])) };
      const options = { temperaturesK: [3, 20], fieldsT: [0.3, 4], direction: 'powder' as const };
      const reduced = magnetization(ion, { ...options, powder: { degree: 29 } });
      const plain = magnetization(ion, { ...options, powder: { grid: lebedevGrid(29) } });
      expect(reduced.powder!.symmetryOperations).toBe(operations);
      expect(plain.powder!.directionsComputed).toBe(151);
      expect(reduced.powder!.directionsComputed).toBeLessThanOrEqual(Math.ceil((302 / operations) * 2)); // small orbits on symmetry axes
      reduced.magnetizationMuB.forEach((row, i) => row.forEach((v, j) => expect(v).toBeCloseTo(plain.magnetizationMuB[i][j], 11)));
    }
  });

  it('is odd in the field and its low-field slope equals the Van Vleck susceptibility', () => {
    const ion = { ...dyLike, parametersMeV: { B20: -0.3, B40: 0.002, B43: 0.01, B66: 1e-5 } };
    const direction: [number, number, number] = [0.3, -0.2, 0.9];
    const r = magnetization(ion, { temperaturesK: [8], fieldsT: [-1e-4, 1e-4], direction });
    expect(r.magnetizationMuB[0][0] / -r.magnetizationMuB[0][1]).toBeCloseTo(1, 8);
    const chi = vanVleckSusceptibility(ion, { temperaturesK: [8], direction }).chiEmuPerMol[0];
    // χ (emu/mol) = M[μB] N_A μB[erg/G] / (B[T] × 10⁴ G/T)
    const fromM = (r.magnetizationMuB[0][1] * AVOGADRO_PER_MOL * BOHR_MAGNETON_J_PER_T * 1e3) / (1e-4 * 1e4);
    expect(fromM / chi).toBeCloseTo(1, 6);
  });

  it('molecular field: M solves M = M₀(B + λ′M), and the slope matches χ with 1/χ = 1/χ₀ − λ', () => {
    const ion = { J: 3.5, gJ: 2, parametersMeV: {} };
    const lambda = -0.4; // mol/emu, antiferromagnetic
    const toEmu = AVOGADRO_PER_MOL * BOHR_MAGNETON_J_PER_T * 1e3;
    const withField = magnetization(ion, { temperaturesK: [3], fieldsT: [2], direction: [0, 0, 1], meanFieldMolPerEmu: lambda }).magnetizationMuB[0][0];
    const bEff = 2 + lambda * toEmu * 1e-4 * withField;
    const bare = magnetization(ion, { temperaturesK: [3], fieldsT: [bEff], direction: [0, 0, 1] }).magnetizationMuB[0][0];
    expect(withField).toBeCloseTo(bare, 10);
    const small = magnetization(ion, { temperaturesK: [3], fieldsT: [1e-4], direction: [0, 0, 1], meanFieldMolPerEmu: lambda }).magnetizationMuB[0][0];
    const chi = vanVleckSusceptibility(ion, { temperaturesK: [3], direction: [0, 0, 1], meanFieldMolPerEmu: lambda }).chiEmuPerMol[0];
    expect((small * toEmu) / 1 / chi).toBeCloseTo(1, 6);
  });

  it('ferromagnetic molecular field: spontaneous moment below the mean-field T_c, none above (Weiss model)', () => {
    // Free spin S = 1/2 (g = 2): M = tanh(μB B_eff/k_BT) μB, B_eff = λ′M; mean-field T_c = μB² λ′/k_B (Weiss).
    const ion = { J: 0.5, gJ: 2, parametersMeV: {} };
    const toTeslaPerMuB = AVOGADRO_PER_MOL * BOHR_MAGNETON_J_PER_T * 1e3 * 1e-4;
    const lambda = 1; // mol/emu → λ′ = 0.5585 T/μB
    const tc = (BOHR_MAGNETON_MEV_PER_T * lambda * toTeslaPerMuB) / BOLTZMANN_MEV_PER_K;
    const r = magnetization(ion, { temperaturesK: [0.5 * tc, 0.99 * tc, 1.5 * tc], fieldsT: [0, -0.01], direction: [0, 0, 1], meanFieldMolPerEmu: lambda });
    for (const [i, t] of [[0, 0.5 * tc], [1, 0.99 * tc]] as const) {
      const m = r.magnetizationMuB[i][0];
      expect(m).toBeGreaterThan(0.05);
      expect(m).toBeCloseTo(Math.tanh((BOHR_MAGNETON_MEV_PER_T * lambda * toTeslaPerMuB * m) / (BOLTZMANN_MEV_PER_K * t)), 9);
    }
    expect(r.magnetizationMuB[2][0]).toBeCloseTo(0, 9);
    expect(r.magnetizationMuB[0][1]).toBeLessThan(-0.9); // the field picks the negative branch
  });

  it('reports progress and can be cancelled during a powder average (LongTask)', () => {
    const calls: number[] = [];
    const task = createTask((done) => calls.push(done));
    const r = magnetization(ising, { temperaturesK: [2], fieldsT: [1], direction: 'powder', powder: { degree: 11 }, task });
    expect(calls.at(-1)).toBe(r.powder!.directionsComputed);
    expect(calls.length).toBe(r.powder!.directionsComputed);
    const cancelled = createTask();
    cancelled.cancel();
    expect(() => magnetization(ising, { temperaturesK: [2], fieldsT: [1], direction: 'powder', task: cancelled })).toThrow(CancelledError);
  });

  it('rejects T ≤ 0, an empty field list, an unknown direction and conflicting powder options', () => {
    const base = { temperaturesK: [1], fieldsT: [1], direction: [0, 0, 1] as [number, number, number] };
    expect(() => magnetization(ising, { ...base, temperaturesK: [0] })).toThrow(InputError);
    expect(() => magnetization(ising, { ...base, fieldsT: [] })).toThrow(InputError);
    expect(() => magnetization(ising, { ...base, direction: 'c-axis' as never })).toThrow(InputError);
    expect(() => magnetization(ising, { ...base, direction: [0, 0, 0] })).toThrow(InputError);
    expect(() => magnetization(ising, { ...base, direction: 'powder', powder: { degree: 11, tolerance: 1e-3 } })).toThrow(InputError);
    expect(() => magnetization(ising, { ...base, sites: 'kagome' as never })).toThrow(InputError);
  });
});
