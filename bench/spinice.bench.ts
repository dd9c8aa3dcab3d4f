// Spin-flip attempts per second of the spin-ice Metropolis sweep for L = 4 (1024 spins) with the full Ewald
// dipolar pair matrix (Dy2Ti2O7-like: J1 = 3.72 K, μ = 10 μB, a = 10.124 Å), beside a plain C reference of the
// same loop (bench/c/spinice_metropolis.c, gcc -O2, compiled here into bench/build/), started from the same
// spins, fields and generator state so that both make the same moves. Target: JS within 2× of C.
import { execFileSync } from 'node:child_process';
import { writeFileSync, mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { spinIceCouplings } from '@multiplet/physics/montecarlo/spinIceCouplings';
import { createReplica } from '@multiplet/physics/montecarlo/replicaState';
import { metropolisSweep } from '@multiplet/physics/montecarlo/metropolisSweep';
import { createRandom } from '@multiplet/physics/random';

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
let jsBest = Infinity;
let jsAccepted = 0;
let jsDE = 0;
for (let r = 0; r < bestOf; r++) {
  const rep = snapshot();
  const e0 = rep.energyK;
  let acc = 0;
  const t0 = performance.now();
  for (let s = 0; s < sweeps; s++) acc += metropolisSweep(c, rep, 1 / temperatureK);
  const dt = (performance.now() - t0) / 1000;
  jsBest = Math.min(jsBest, dt);
  jsAccepted = acc;
  jsDE = rep.energyK - e0;
}
let cBest = Infinity;
let cLine = '';
for (let r = 0; r < bestOf; r++) {
  cLine = execFileSync(exe, [input], { encoding: 'utf8' }).trim();
  cBest = Math.min(cBest, Number(cLine.split(' ')[1]));
}
const [, , cAcc, cDE] = cLine.split(' ').map(Number);
const attempts = sweeps * N;
const jsRate = attempts / jsBest;
const cRate = attempts / cBest;
console.log(`spin ice Metropolis, L = 4 (N = ${N}), dense Ewald dipolar matrix, T = ${temperatureK} K, ${sweeps} sweeps (best of ${bestOf})`);
console.log(`  TypeScript (Node ${process.version}): ${(jsRate / 1e6).toFixed(2)} M attempts/s  (accepted ${jsAccepted}, ΔE ${jsDE.toFixed(6)} K)`);
console.log(`  C (gcc -O2):                ${(cRate / 1e6).toFixed(2)} M attempts/s  (accepted ${cAcc}, ΔE ${cDE.toFixed(6)} K)`);
console.log(`  ratio C/TS = ${(cRate / jsRate).toFixed(2)}  (target ≤ 2)`);
console.log(`  same moves: ${jsAccepted === cAcc ? 'yes' : 'no (exp() rounding can change a rare acceptance)'}`);
