/**
 * The Monte Carlo driver for Ising spin ice: one replica per temperature, each Monte Carlo step is a sweep of
 * single-spin Metropolis plus loop moves for every replica, then replica-exchange attempts between neighbouring
 * temperatures (parallel tempering: Hukushima & Nemoto, J. Phys. Soc. Jpn. 65, 1604 (1996)). Measurements are
 * taken after every step once thermalization is over. The driver is steppable so that the same code runs
 * synchronously, in a worker thread, or in-thread with cooperative yields.
 */
import { spinIceCouplings, type SpinIceCouplings, type SpinIceModel } from './spinIceCouplings';
import { createReplica, refreshReplica, type ReplicaState } from './replicaState';
import { createRowUpdateKernel } from './rowUpdateKernel';
import { metropolisSweep } from './metropolisSweep';
import { loopMove } from './loopMove';
import { orderParameter001 } from './orderParameter001';
import { createRandom, type Random } from '../random';
import type { ShellName } from '../lattice/neighbourShells';
import { InputError } from '../errors';

/** Options of a run. */
export interface SpinIceRunOptions {
  model: SpinIceModel;
  /** Temperatures in K (distinct, positive; any order; results come back in this order). */
  temperaturesK: readonly number[];
  /** Measured Monte Carlo steps (one step = N single-flip attempts + loop moves, per replica). */
  sweeps: number;
  /** Steps discarded first; default sweeps / 2. */
  thermalizationSweeps?: number;
  seed: number;
  /** Loop-move attempts per step and replica; default max(1, N/64). 0 switches loops off. */
  loopMovesPerSweep?: number;
  /** Replica exchange between neighbouring temperatures after every step; default true. */
  parallelTempering?: boolean;
  /** Keep a copy of the spins every this many measured steps (for structure factors); default 0 (none). */
  snapshotEvery?: number;
  /** Record the exchange-shell sums every step (needed to reweight in J1..J3b, e.g. for fits); default false. */
  recordShellSums?: boolean;
  /** Starting configuration for every replica (e.g. an ordered state); default random. */
  initialSpins?: Int8Array;
}

/** Time series recorded per temperature (index in the caller's temperature order). */
export interface SpinIceSeries {
  /** Total energy in K. */
  energyK: Float64Array[];
  /** Σ_i σ_i ẑ_i·n̂ (dimensionless); magnetization per spin = μ × this / N. */
  projection: Float64Array[];
  /** Σ_{pairs in shell} ẑ_i·ẑ_j σ_i σ_j for each exchange shell (each pair once), for reweighting in J
   * (zeros unless `recordShellSums`). */
  shellSums: Record<ShellName, Float64Array[]>;
  /** ψ of the q = (001) state. */
  orderParameter: Float64Array[];
}

/** Everything a finished (or stopped) run hands back. */
export interface SpinIceRawResult {
  couplings: SpinIceCouplings;
  temperaturesK: number[];
  measuredSweeps: number;
  series: SpinIceSeries;
  snapshots: Int8Array[][];
  acceptance: { singleFlip: number[]; loop: number[]; swap: number[] };
}

/** A steppable run. */
export interface SpinIceSimulation {
  readonly totalSteps: number;
  readonly stepsDone: number;
  /** One Monte Carlo step for all replicas (+ swaps, + measurement after thermalization); `checkpoint` is called
   * before each replica so that a cancellation lands within one replica sweep. */
  step(checkpoint?: () => void): void;
  /** The series recorded so far. */
  raw(): SpinIceRawResult;
}

const SHELLS: ShellName[] = ['J1', 'J2', 'J3a', 'J3b'];

/**
 * Prepare a run (builds the couplings, including the Ewald matrix when dipolar is on).
 * @example const sim = createSpinIceSimulation({ model, temperaturesK: [2, 1, 0.5], sweeps: 1000, seed: 1 });
 *          while (sim.stepsDone < sim.totalSteps) sim.step();
 * See also: runSpinIceMonteCarlo, summarizeSpinIceRun
 */
export function createSpinIceSimulation(options: SpinIceRunOptions): SpinIceSimulation {
  const temps = options.temperaturesK;
  if (!Array.isArray(temps) || temps.length === 0) throw new InputError('temperaturesK', temps, 'a non-empty list of temperatures in K');
  temps.forEach((t, k) => {
    if (!(t > 0) || !Number.isFinite(t)) throw new InputError(`temperaturesK[${k}]`, t, 'a positive temperature in K');
  });
  if (new Set(temps).size !== temps.length) throw new InputError('temperaturesK', temps, 'distinct temperatures');
  if (!Number.isInteger(options.sweeps) || options.sweeps < 40) throw new InputError('sweeps', options.sweeps, 'an integer ≥ 40 (20 bins of at least 2)');
  const therm = options.thermalizationSweeps ?? Math.floor(options.sweeps / 2);
  if (!Number.isInteger(therm) || therm < 0) throw new InputError('thermalizationSweeps', therm, 'a non-negative integer');
  if (!Number.isFinite(options.seed)) throw new InputError('seed', options.seed, 'a finite number');
  const c = spinIceCouplings(options.model);
  const N = c.numberOfSites;
  const loops = options.loopMovesPerSweep ?? Math.max(1, Math.floor(N / 64));
  if (!Number.isInteger(loops) || loops < 0) throw new InputError('loopMovesPerSweep', loops, 'a non-negative integer');
  const snapEvery = options.snapshotEvery ?? 0;
  if (!Number.isInteger(snapEvery) || snapEvery < 0) throw new InputError('snapshotEvery', snapEvery, 'a non-negative integer');
  if (options.initialSpins && options.initialSpins.length !== N) throw new InputError('initialSpins', options.initialSpins.length, `${N} spins`);
  const pt = options.parallelTempering ?? true;
  const recordShells = options.recordShellSums ?? false;
  const nT = temps.length;
  // Slots sorted by temperature (ascending) so that swaps pair neighbours.
  const slotTemp = temps.map((t, k) => ({ t, k })).sort((p, q) => p.t - q.t);
  const slotBeta = slotTemp.map((x) => 1 / x.t);
  const rng: Random = createRandom(options.seed);
  const replicas: ReplicaState[] = [];
  // Dense (dipolar) case: matrix and fields in one WebAssembly memory for the SIMD row update (same numbers).
  const kernel = c.dense ? createRowUpdateKernel(c.dense, N, nT) ?? null : null;
  if (kernel) c.dense = kernel.matrix;
  for (let k = 0; k < nT; k++) replicas.push(createReplica(c, rng.fork(), options.initialSpins, kernel, k));
  const replicaAtSlot = Int32Array.from({ length: nT }, (_, k) => k);
  const M = options.sweeps;
  // Series grow by doubling, so that a long run that is cancelled early never allocated its full length.
  let capacity = Math.min(M, 1024);
  const series: SpinIceSeries = {
    energyK: temps.map(() => new Float64Array(capacity)),
    projection: temps.map(() => new Float64Array(capacity)),
    shellSums: Object.fromEntries(SHELLS.map((s) => [s, temps.map(() => new Float64Array(recordShells ? capacity : 0))])) as Record<ShellName, Float64Array[]>,
    orderParameter: temps.map(() => new Float64Array(capacity)),
  };
  const grow = () => {
    capacity = Math.min(M, capacity * 2);
    const g = (arr: Float64Array[]) => arr.map((a) => {
      const b = new Float64Array(capacity);
      b.set(a);
      return b;
    });
    series.energyK = g(series.energyK);
    series.projection = g(series.projection);
    series.orderParameter = g(series.orderParameter);
    if (recordShells) for (const s of SHELLS) series.shellSums[s] = g(series.shellSums[s]);
  };
  const snapshots: Int8Array[][] = temps.map(() => []);
  const flipAcc = new Float64Array(nT);
  const loopAcc = new Float64Array(nT);
  const loopTried = new Float64Array(nT);
  const swapAcc = new Float64Array(nT);
  const swapTried = new Float64Array(nT);
  const axes = c.cell.localAxes;
  const shellSign = SHELLS.map((s) => {
    const nl = c.shellLists[s];
    const sign = new Float64Array(nl.neighbours.length);
    for (let i = 0; i < N; i++)
      for (let p = nl.offsets[i]; p < nl.offsets[i + 1]; p++) {
        const j = nl.neighbours[p];
        sign[p] = axes[3 * i] * axes[3 * j] + axes[3 * i + 1] * axes[3 * j + 1] + axes[3 * i + 2] * axes[3 * j + 2];
      }
    return sign;
  });
  let done = 0;
  let measured = 0;
  const total = therm + M;

  const step = (checkpoint?: () => void) => {
    if (done >= total) return;
    for (let k = 0; k < nT; k++) {
      checkpoint?.();
      const r = replicas[replicaAtSlot[k]];
      const beta = slotBeta[k];
      const user = slotTemp[k].k;
      flipAcc[user] += metropolisSweep(c, r, beta) / N;
      for (let l = 0; l < loops; l++) {
        const o = loopMove(c, r, beta);
        if (o > 0) loopTried[user]++;
        if (o === 2) loopAcc[user]++;
      }
    }
    if (pt && nT > 1) {
      for (let k = done & 1; k + 1 < nT; k += 2) {
        const a = replicaAtSlot[k], b = replicaAtSlot[k + 1];
        const delta = (slotBeta[k] - slotBeta[k + 1]) * (replicas[a].energyK - replicas[b].energyK);
        swapTried[slotTemp[k].k]++;
        if (delta >= 0 || rng.next() < Math.exp(delta)) {
          replicaAtSlot[k] = b;
          replicaAtSlot[k + 1] = a;
          swapAcc[slotTemp[k].k]++;
        }
      }
    }
    done++;
    if (done % 256 === 0) for (const r of replicas) refreshReplica(c, r);
    if (done > therm) {
      if (measured >= capacity) grow();
      for (let k = 0; k < nT; k++) {
        const r = replicas[replicaAtSlot[k]];
        const user = slotTemp[k].k;
        const s = r.spins;
        series.energyK[user][measured] = r.energyK;
        let proj = 0;
        for (let i = 0; i < N; i++) proj += s[i] * c.projection[i];
        series.projection[user][measured] = proj;
        for (let q = 0; q < 4 && recordShells; q++) {
          const nl = c.shellLists[SHELLS[q]];
          const sign = shellSign[q];
          let sum = 0;
          for (let i = 0; i < N; i++) {
            let h = 0;
            for (let p = nl.offsets[i]; p < nl.offsets[i + 1]; p++) h += sign[p] * s[nl.neighbours[p]];
            sum += s[i] * h;
          }
          series.shellSums[SHELLS[q]][user][measured] = sum / 2;
        }
        series.orderParameter[user][measured] = orderParameter001(c.cell, s);
        if (snapEvery > 0 && (measured + 1) % snapEvery === 0) snapshots[user].push(Int8Array.from(s));
      }
      measured++;
    }
  };

  return {
    totalSteps: total,
    get stepsDone() {
      return done;
    },
    step,
    raw() {
      const cut = (arr: Float64Array[]) => arr.map((a) => (a.length >= measured ? a.slice(0, measured) : new Float64Array(measured)));
      return {
        couplings: c,
        temperaturesK: [...temps],
        measuredSweeps: measured,
        series: {
          energyK: cut(series.energyK),
          projection: cut(series.projection),
          shellSums: Object.fromEntries(SHELLS.map((s) => [s, cut(series.shellSums[s])])) as Record<ShellName, Float64Array[]>,
          orderParameter: cut(series.orderParameter),
        },
        snapshots,
        acceptance: {
          singleFlip: temps.map((_, k) => flipAcc[k] / Math.max(1, done)),
          loop: temps.map((_, k) => (loopTried[k] > 0 ? loopAcc[k] / loopTried[k] : 0)),
          swap: temps.map((_, k) => (swapTried[k] > 0 ? swapAcc[k] / swapTried[k] : 0)),
        },
      };
    },
  };
}
