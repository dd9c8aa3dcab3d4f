/**
 * Throughput of batch diagonalisation of random 16×16 complex Hermitian matrices (eigenvalues and eigenvectors):
 * the project's solver (hermitianEigenBatch), mathjs.eigs on a subset of the same matrices, and LAPACK (zheevd via
 * NumPy's batched numpy.linalg.eigh, Debian's python3-numpy) on the same number of matrices generated in Python.
 * Targets (issue 2): ≥ 50× mathjs and ≥ ½ of the LAPACK rate.
 * Run: `npm run bench eigen`.
 */
import { spawnSync } from 'node:child_process';
import * as math from 'mathjs';
import { hermitianEigenBatch, hermitianEigen } from '@multiplet/physics/linalg';
import { createRandom } from '@multiplet/physics/random';
import { randomHermitian } from '../test/physics/linalg/randomHermitian';

const N = 16;
const COUNT = 20_000;
const MATHJS_COUNT = 40;
const REPEATS = 5;


const rng = createRandom(16);
const matrices = Array.from({ length: COUNT }, () => randomHermitian(N, rng));

// Ours: best of several runs (the first warms up the JIT).
let bestOurs = Infinity;
let checksum = 0;
for (let r = 0; r < REPEATS; r++) {
  const t0 = process.hrtime.bigint();
  const results = hermitianEigenBatch(matrices);
  const seconds = Number(process.hrtime.bigint() - t0) / 1e9;
  bestOurs = Math.min(bestOurs, seconds);
  checksum += results[COUNT - 1].values[0];
}
const oursRate = COUNT / bestOurs;

// Values only, for information.
let bestValuesOnly = Infinity;
for (let r = 0; r < REPEATS; r++) {
  const t0 = process.hrtime.bigint();
  hermitianEigenBatch(matrices, { vectors: false });
  bestValuesOnly = Math.min(bestValuesOnly, Number(process.hrtime.bigint() - t0) / 1e9);
}

// mathjs on the first MATHJS_COUNT of the same matrices; also check agreement of the eigenvalues.
const mathjsInputs = matrices.slice(0, MATHJS_COUNT).map((a) => {
  const rows: math.Complex[][] = [];
  for (let i = 0; i < N; i++) {
    const row: math.Complex[] = [];
    for (let j = 0; j < N; j++) row.push(math.complex(a.re[i * N + j], a.im[i * N + j]));
    rows.push(row);
  }
  return math.matrix(rows);
});
let worstValueDiff = 0;
const t1 = process.hrtime.bigint();
const mathjsResults = mathjsInputs.map((m) => math.eigs(m));
const mathjsSeconds = Number(process.hrtime.bigint() - t1) / 1e9;
const mathjsRate = MATHJS_COUNT / mathjsSeconds;
mathjsResults.forEach((res, i) => {
  const ref = ((res.values as math.Matrix).toArray() as unknown[])
    .map((x) => (typeof x === 'number' ? x : (x as math.Complex).re))
    .sort((p, q) => p - q);
  const ours = hermitianEigen(matrices[i]).values;
  ref.forEach((v, k) => (worstValueDiff = Math.max(worstValueDiff, Math.abs(v - ours[k]))));
});

// LAPACK via NumPy (zheevd through numpy.linalg.eigh on a stacked array).
const python = `
import numpy as np, time, json
rng = np.random.default_rng(16)
n, count = ${N}, ${COUNT}
x = rng.standard_normal((count, n, n)) + 1j * rng.standard_normal((count, n, n))
a = np.tril(x, -1); a = a + np.conj(np.swapaxes(a, 1, 2))
idx = np.arange(n); a[:, idx, idx] = rng.standard_normal((count, n))
best = float('inf')
for _ in range(${REPEATS}):
    t0 = time.perf_counter(); w, v = np.linalg.eigh(a); best = min(best, time.perf_counter() - t0)
print(json.dumps({"seconds": best, "numpy": np.__version__}))
`;
let lapackRate = NaN;
let lapackNote = '';
const py = spawnSync('/usr/bin/python3', ['-c', python], { encoding: 'utf8', env: { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1' } });
if (py.status === 0) {
  const parsed = JSON.parse(py.stdout.trim().split('\n').pop() ?? '{}') as { seconds: number; numpy: string };
  lapackRate = COUNT / parsed.seconds;
  lapackNote = `numpy ${parsed.numpy}, single thread`;
} else {
  lapackNote = `python3/numpy unavailable: ${(py.stderr || py.error?.message || '').trim().split('\n').pop()}`;
}

const fmt = (x: number) => (Number.isFinite(x) ? Math.round(x).toLocaleString('en-US') : 'n/a');
console.log(`16×16 complex Hermitian, eigenvalues + eigenvectors (${COUNT} matrices, best of ${REPEATS}):`);
console.log(`  multiplet hermitianEigenBatch : ${fmt(oursRate)} matrices/s   (values only: ${fmt(COUNT / bestValuesOnly)}/s)`);
console.log(`  mathjs eigs (${MATHJS_COUNT} of them)      : ${fmt(mathjsRate)} matrices/s   (max |Δλ| vs ours ${worstValueDiff.toExponential(1)})`);
console.log(`  LAPACK numpy.linalg.eigh      : ${fmt(lapackRate)} matrices/s   (${lapackNote})`);
console.log(`  ratio ours / mathjs  = ${(oursRate / mathjsRate).toFixed(1)}×   (target ≥ 50×)`);
console.log(`  ratio ours / LAPACK  = ${(oursRate / lapackRate).toFixed(2)}   (target ≥ 0.5)`);
if (!Number.isFinite(checksum)) process.exit(1);
