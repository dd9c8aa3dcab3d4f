// Spin-flip attempts per second of the spin-ice Metropolis sweep for L = 4 (1024 spins) with the full Ewald
// dipolar pair matrix (a dysprosium pyrochlore: J1 = 3.72 K, μ = 10 μB, a = 10.124 Å), beside a plain C reference of the
// same loop (bench/c/spinice_metropolis.c, gcc -O2, compiled here into bench/build/), started from the same
// spins, fields and generator state so that both make the same moves. Target: JS within 2× of C. The simulation
// path uses the WebAssembly SIMD row update (montecarlo/rowUpdateKernel.ts); the plain JavaScript loop (used where
// WebAssembly is missing) is timed too.
import { execFileSync } from 'node:child_process';
import { writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { spinIceCouplings } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { createReplica } from '@multiplet/physics/montecarlo/replicaState';
import { metropolisSweep } from '@multiplet/physics/montecarlo/metropolisSweep';
import { createRandom } from '@multiplet/physics/random';
import { createRowUpdateKernel } from '@multiplet/physics/montecarlo/rowUpdateKernel';

const root = process.cwd();
const buildDir = join(root, 'bench/build');
mkdirSync(buildDir, { recursive: true });
const exe = join(buildDir, 'spinice_metropolis');
execFileSync('gcc', ['-O2', '-o', exe, join(root, 'bench/c/spinice_metropolis.c'), '-lm']);

const c = spinIceCouplings({ L: 4, latticeConstantAngstrom: 10.124, momentMuB: 10, exchangeK: { J1: 3.72 }, dipolar: true });
const N = c.numberOfSites;
const temperatureK = 1.0;
const sweeps = 400;

function snapshot() {
  const rep = createReplica(c, createRandom(2024));
  for (let k = 0; k < 20; k++) metropolisSweep(c, rep, 1 / temperatureK); // leave the random start
  return rep;
}

// C input: same start.
const start = snapshot();
const state = start.random.state();
const header = Buffer.alloc(4 + 4 + 8 + 16);
header.writeInt32LE(N, 0);
header.writeInt32LE(sweeps, 4);
header.writeDoubleLE(1 / temperatureK, 8);
state.forEach((v, k) => header.writeUInt32LE(v >>> 0, 16 + 4 * k));
const input = join(buildDir, 'spinice_input.bin');
writeFileSync(input, Buffer.concat([header, Buffer.from(start.spins.buffer.slice(0)), Buffer.from(start.fieldsK.buffer.slice(0)), Buffer.from(c.dense!.buffer)]));

const bestOf = 3;
const kernel = createRowUpdateKernel(c.dense!, N, 1);
const cKernel = kernel ? { ...c, dense: kernel.matrix } : c;
function timeJs(useKernel: boolean) {
  let best = Infinity;
  let accepted = 0;
  let dE = 0;
  for (let r = 0; r < bestOf; r++) {
    const start = snapshot();
    const rep = useKernel && kernel ? createReplica(cKernel, createRandom(start.random.state()), start.spins, kernel, 0) : start;
    if (useKernel && kernel) rep.fieldsK.set(start.fieldsK);
    const cc = useKernel ? cKernel : c;
    const e0 = rep.energyK;
    let acc = 0;
    const t0 = performance.now();
    for (let s = 0; s < sweeps; s++) acc += metropolisSweep(cc, rep, 1 / temperatureK);
    best = Math.min(best, (performance.now() - t0) / 1000);
    accepted = acc;
    dE = rep.energyK - e0;
  }
  return { best, accepted, dE };
}
const js = timeJs(false);
const wasm = timeJs(true);
const jsBest = wasm.best;
const jsAccepted = wasm.accepted;
const jsDE = wasm.dE;
let cBest = Infinity;
let cLine = '';
for (let r = 0; r < bestOf; r++) {
  cLine = execFileSync(exe, [input], { encoding: 'utf8' }).trim();
  cBest = Math.min(cBest, Number(cLine.split(' ')[1]));
}
const [, , cAcc, cDE] = cLine.split(' ').map(Number);
const attempts = sweeps * N;
const jsRate = attempts / jsBest;
const plainRate = attempts / js.best;
const cRate = attempts / cBest;
console.log(`spin ice Metropolis, L = 4 (N = ${N}), dense Ewald dipolar matrix, T = ${temperatureK} K, ${sweeps} sweeps (best of ${bestOf})`);
console.log(`  TypeScript + WASM SIMD row update (Node ${process.version}): ${(jsRate / 1e6).toFixed(2)} M attempts/s  (accepted ${jsAccepted}, ΔE ${jsDE.toFixed(6)} K)${kernel ? '' : '  [WebAssembly unavailable: plain loop]'}`);
console.log(`  TypeScript, plain JavaScript row loop:           ${(plainRate / 1e6).toFixed(2)} M attempts/s  (accepted ${js.accepted}, ΔE ${js.dE.toFixed(6)} K)`);
console.log(`  C (gcc -O2):                                     ${(cRate / 1e6).toFixed(2)} M attempts/s  (accepted ${cAcc}, ΔE ${cDE.toFixed(6)} K)`);
console.log(`  ratio C/TS = ${(cRate / jsRate).toFixed(2)} with the SIMD kernel, ${(cRate / plainRate).toFixed(2)} with the plain loop  (target ≤ 2)`);
console.log(`  same moves: ${jsAccepted === cAcc && js.accepted === cAcc ? 'yes' : 'no (exp() rounding can change a rare acceptance)'}`);
