/**
 * Throughput of the crystal-field engine on a trigonal (D3d) Dy3+ field, J = 15/2 (16×16): building H_CEF from
 * cached Stevens operators, and the full solveCef (diagonalisation, levels, g-tensor). Informational, no target.
 */
import { cefHamiltonian } from '../packages/physics/src/cef/cefHamiltonian';
import { solveCef } from '../packages/physics/src/cef/solveCef';
import { getIon } from '../packages/physics/src/ions';

const B = { B20: -0.2, B40: 1e-3, B43: 1e-2, B60: 1e-5, B63: -1e-4, B66: 1e-4 };
const dy = getIon('Dy3+');

function rate(label: string, count: number, work: () => void): void {
  work();
  const t0 = performance.now();
  for (let i = 0; i < count; i++) work();
  const seconds = (performance.now() - t0) / 1000;
  console.log(`${label}: ${(count / seconds).toFixed(0)} per second (${((seconds / count) * 1e6).toFixed(1)} µs each)`);
}

rate('cefHamiltonian Dy3+ D3d (6 parameters, 16×16)', 20000, () => cefHamiltonian(dy.J, B));
rate('solveCef Dy3+ D3d (eigenvectors, levels, g-tensor)', 5000, () => solveCef(dy, B));
