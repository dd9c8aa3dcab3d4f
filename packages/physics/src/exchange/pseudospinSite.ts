/**
 * One ion prepared for the effective-exchange calculation: its CEF eigenstates reordered as
 * [|↑⟩, |↓⟩, excited states…], the local angular-momentum operators in that basis, and the pseudospin-1/2
 * convention fixed once so that the results do not depend on the phases a diagonaliser happened to return.
 *
 * Pseudospin convention (stated once here; README "exchange"):
 *  - |↑⟩, |↓⟩ diagonalise J^z (local frame) inside the ground doublet, ⟨↑|J^z|↑⟩ ≥ ⟨↓|J^z|↓⟩, so S^z is along the
 *    local ẑ moment direction.
 *  - The relative phase is fixed by making ⟨↑|O|↓⟩ real and positive for the first operator O of
 *    J^+ (magnetic-dipole transverse components: Kramers "dipolar" doublets), {J^z, J^+} and (J^−)² (quadrupolar
 *    transverse components of non-Kramers doublets) whose matrix element does not vanish. All three change m by
 *    +1 modulo 3, so S^± = S^x ± iS^y transform like J^± under the local three-fold rotation and the usual bond
 *    phases apply. Then S^x points along the local x̂ of the frame (for J^+: P J^x P = c S^x with c > 0).
 *  - If none of them connects the doublet but they do with ↑ and ↓ exchanged (↑ state with m ≡ −1/2 mod 3 for
 *    Kramers, m ≡ +1 mod 3 for non-Kramers, e.g. mostly |±4⟩), ↑ and ↓ are exchanged (`zReversed`): S^z then
 *    points against the local ẑ moment (g_zz < 0 in `gLocal`). For non-Kramers doublets this changes no allowed
 *    coupling (J_z± vanishes by time reversal); for Kramers doublets it fixes the sign convention of J_z±.
 *  - Otherwise (dipolar-octupolar doublets, pure |±J⟩ states) the phase is fixed by the lowest power (J^+)^k,
 *    k ≥ 3, with a non-zero matrix element; the transverse pseudospin components are then higher multipoles and
 *    the four-coupling form is not the natural description (see `residualMeV` of the couplings).
 * Common practice for the construction (e.g. Annu. Rev. Condens. Matter Phys. 10, 357 (2019),
 * §2; from memory); the operator list and the ordering rule are our own.
 */
import { InputError } from '../errors';
import { zeros, multiply, adjoint, type ComplexMatrix } from '../linalg/complexMatrix';
import { hermitianEigen } from '../linalg/hermitianEigen';
import { angularMomentumMatrices } from '../cef/angularMomentum';
import { doubletGRow, matrixElement } from '../cef/groundDoubletGTensor';
import { solveCef, type CefSolution } from '../cef/solveCef';
import type { CefParameters } from '../cef/cefHamiltonian';
import type { Ion } from '../ions';

/** How the transverse pseudospin components were defined (see the module comment). */
export type DoubletKind = 'dipolar' | 'quadrupolar' | 'multipolar';

/** An ion's CEF states and operators in the pseudospin-adapted basis. */
export interface PseudospinSite {
  ion: Ion;
  J: number;
  /** 2J + 1. */
  dimension: number;
  /** Energies of the reordered states, meV, ground doublet at 0: [0, 0, E_2, …]. */
  energiesMeV: Float64Array;
  /** The reordered states as columns in |J, m⟩ amplitudes (local frame): column 0 = |↑⟩, 1 = |↓⟩. */
  states: ComplexMatrix;
  /** J^x, J^y, J^z of the local frame in the basis of `states` (⟨s|J^a|t⟩). */
  jLocal: [ComplexMatrix, ComplexMatrix, ComplexMatrix];
  /** Gap from the ground doublet to the first excited state, meV. */
  gapMeV: number;
  kramers: boolean;
  doubletKind: DoubletKind;
  /** True when ↑ and ↓ were exchanged to keep S^± transforming like J^± (see module comment): g_zz < 0. */
  zReversed: boolean;
  /** Pseudospin g-tensor in the local frame: μ_a = μB Σ_b g[a][b] S^b, g[a][b] = g_J Tr(P J^a P σ^b). */
  gLocal: number[][];
}

/** Options for building a site. */
export interface PseudospinSiteOptions {
  /** Ground levels closer than this are one doublet; the next state must lie above it (default 1e-4 meV). */
  degeneracyToleranceMeV?: number;
  /** Field path for errors (default 'ion'). */
  field?: string;
}

function maxAbs(m: ComplexMatrix): number {
  let w = 0;
  for (let k = 0; k < m.re.length; k++) w = Math.max(w, Math.abs(m.re[k]) + Math.abs(m.im[k]));
  return w;
}

/**
 * Prepare an ion for the exchange calculation from its CEF eigen-decomposition (any phases, any basis inside
 * the ground doublet: the pseudospin convention of this module is imposed here).
 *
 * Units: energies in meV. The ground level must be exactly a doublet (within the tolerance).
 * @example const site = pseudospinSite(getIon('Yb3+'), solution.energiesMeV, solution.eigenvectors);
 * @throws InputError when the ground level is not a doublet.
 * See also: pseudospinSiteFromParameters, effectiveExchange
 */
export function pseudospinSite(
  ion: Ion,
  energiesMeV: ArrayLike<number>,
  eigenvectors: ComplexMatrix,
  options: PseudospinSiteOptions = {},
): PseudospinSite {
  const field = options.field ?? 'ion';
  const tol = options.degeneracyToleranceMeV ?? 1e-4;
  const J = ion.J;
  const n = Math.round(2 * J + 1);
  if (eigenvectors.n !== n || energiesMeV.length !== n)
    throw new InputError(`${field}.eigenvectors`, eigenvectors.n, `${n} eigenstates for J = ${J}`);
  // Sort by energy (callers normally give ascending energies already).
  const order = Array.from({ length: n }, (_, k) => k).sort((a, b) => energiesMeV[a] - energiesMeV[b]);
  const e0 = energiesMeV[order[0]];
  const rel = order.map((k) => energiesMeV[k] - e0);
  if (n < 2 || rel[1] > tol || (n > 2 && rel[2] <= tol)) {
    const degeneracy = rel.filter((e) => e <= tol).length;
    throw new InputError(field, `${ion.name} with a ${degeneracy}-fold ground level`, 'a CEF with a doublet ground state (pseudospin 1/2)');
  }
  const gapMeV = n > 2 ? rel[2] : Infinity;
  const ops = angularMomentumMatrices(J);

  // Columns: the two doublet states first, then the excited states in ascending energy.
  const states = zeros(n);
  order.forEach((k, col) => {
    for (let r = 0; r < n; r++) {
      states.re[r * n + col] = eigenvectors.re[r * n + k];
      states.im[r * n + col] = eigenvectors.im[r * n + k];
    }
  });

  // 1. Diagonalise J^z inside the doublet, ↑ = larger ⟨J^z⟩.
  const jz = zeros(2);
  for (let a = 0; a < 2; a++)
    for (let b = 0; b < 2; b++) {
      const [re, im] = matrixElement(states, a, ops.Jz, b);
      jz.re[a * 2 + b] = -re; // negated: ascending eigenvalues give ⟨J^z⟩ descending
      jz.im[a * 2 + b] = -im;
    }
  const w = hermitianEigen(jz, { hermitianTolerance: 1e-6 }).vectors;
  rotateDoublet(states, w);

  // 2. Relative phase from the first connecting Δm ≡ +1 (mod 3) operator; else with ↑, ↓ exchanged; else (J^+)^k.
  const jzJp = multiply(ops.Jz, ops.Jplus);
  const jpJz = multiply(ops.Jplus, ops.Jz);
  const anticommutator = zeros(n);
  for (let k = 0; k < n * n; k++) {
    anticommutator.re[k] = jzJp.re[k] + jpJz.re[k];
    anticommutator.im[k] = jzJp.im[k] + jpJz.im[k];
  }
  const jminus2 = multiply(ops.Jminus, ops.Jminus);
  const candidates: Array<[ComplexMatrix, DoubletKind]> = [
    [ops.Jplus, 'dipolar'],
    [anticommutator, 'quadrupolar'],
    [jminus2, 'quadrupolar'],
  ];
  let kind: DoubletKind | null = null;
  let zReversed = false;
  const tryOps = (list: Array<[ComplexMatrix, DoubletKind]>): boolean => {
    for (const [op, k] of list) {
      const [re, im] = matrixElement(states, 0, op, 1);
      const mod = Math.hypot(re, im);
      if (mod > 1e-9 * Math.max(1, maxAbs(op))) {
        setPhase(states, re / mod, -im / mod);
        kind = k;
        return true;
      }
    }
    return false;
  };
  if (!tryOps(candidates)) {
    swapDoublet(states);
    if (tryOps(candidates)) zReversed = true;
    else {
      swapDoublet(states);
      let power = multiply(multiply(ops.Jplus, ops.Jplus), ops.Jplus);
      const powers: Array<[ComplexMatrix, DoubletKind]> = [];
      for (let k = 3; k <= 2 * J; k++) {
        powers.push([power, 'multipolar']);
        power = multiply(power, ops.Jplus);
      }
      tryOps(powers);
      if (kind === null) kind = 'multipolar';
    }
  }

  const adj = adjoint(states);
  const jLocal: [ComplexMatrix, ComplexMatrix, ComplexMatrix] = [
    multiply(multiply(adj, ops.Jx), states),
    multiply(multiply(adj, ops.Jy), states),
    multiply(multiply(adj, ops.Jz), states),
  ];
  const energies = new Float64Array(n);
  for (let k = 2; k < n; k++) energies[k] = rel[k];
  return {
    ion,
    J,
    dimension: n,
    energiesMeV: energies,
    states,
    jLocal,
    gapMeV,
    kramers: ion.kramers,
    doubletKind: kind as DoubletKind,
    zReversed,
    gLocal: doubletG(jLocal, ion.gJ),
  };
}

/**
 * Solve the CEF (parameters in meV, local frame) and prepare the ion for the exchange calculation.
 * @example pseudospinSiteFromParameters(getIon('Dy3+'), { B20: -0.5 }) // |±15/2⟩ Ising doublet
 * See also: pseudospinSite, solveCef
 */
export function pseudospinSiteFromParameters(ion: Ion, parametersMeV: CefParameters, options: PseudospinSiteOptions = {}): PseudospinSite {
  const solution: CefSolution = solveCef(ion, parametersMeV, { degeneracyToleranceMeV: options.degeneracyToleranceMeV });
  return pseudospinSite(ion, solution.energiesMeV, solution.eigenvectors, options);
}

/** Replace columns 0, 1 of `states` by states·w (w a 2×2 unitary, columns = new states). */
function rotateDoublet(states: ComplexMatrix, w: ComplexMatrix): void {
  const n = states.n;
  for (let r = 0; r < n; r++) {
    const ar = states.re[r * n], ai = states.im[r * n], br = states.re[r * n + 1], bi = states.im[r * n + 1];
    for (let c = 0; c < 2; c++) {
      const w0r = w.re[c], w0i = w.im[c], w1r = w.re[2 + c], w1i = w.im[2 + c];
      states.re[r * n + c] = ar * w0r - ai * w0i + br * w1r - bi * w1i;
      states.im[r * n + c] = ar * w0i + ai * w0r + br * w1i + bi * w1r;
    }
  }
}

function swapDoublet(states: ComplexMatrix): void {
  const n = states.n;
  for (let r = 0; r < n; r++) {
    const tr = states.re[r * n], ti = states.im[r * n];
    states.re[r * n] = states.re[r * n + 1];
    states.im[r * n] = states.im[r * n + 1];
    states.re[r * n + 1] = tr;
    states.im[r * n + 1] = ti;
  }
}

/** Multiply column 1 (|↓⟩) by the unit complex number (pr + i pi). */
function setPhase(states: ComplexMatrix, pr: number, pi: number): void {
  const n = states.n;
  for (let r = 0; r < n; r++) {
    const xr = states.re[r * n + 1], xi = states.im[r * n + 1];
    states.re[r * n + 1] = xr * pr - xi * pi;
    states.im[r * n + 1] = xr * pi + xi * pr;
  }
}

/** g[a][b] = g_J Tr(P J^a P σ^b) with σ in the (↑, ↓) basis: rows by doubletGRow (cef/groundDoubletGTensor). */
function doubletG(jLocal: [ComplexMatrix, ComplexMatrix, ComplexMatrix], gJ: number): number[][] {
  return jLocal.map((m) => doubletGRow(gJ, m.re[0], m.re[m.n + 1], m.re[1], m.im[1])); // ⟨↑|J|↑⟩, ⟨↓|J|↓⟩, ⟨↑|J|↓⟩
}
