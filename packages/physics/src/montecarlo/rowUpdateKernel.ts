/**
 * The one hot loop of the dense (dipolar) Monte Carlo — after an accepted flip of spin i, every local field moves by
 * 2σ_i' J_ij: F_j += α J_ij for j = 0..N−1 — as a 60-byte WebAssembly SIMD function (two doubles per instruction).
 * V8 does not vectorize the JavaScript loop, which ran about 4× slower than gcc -O2 C; this kernel matches C
 * (bench/spinice.bench.ts). f64x2.mul and f64x2.add round exactly like the scalar operations (no fused
 * multiply–add), so results are bit-identical to the JavaScript loop (checked in the tests). Where WebAssembly SIMD
 * is not available the caller keeps the JavaScript loop.
 *
 * Encoding: WebAssembly Core Specification 2.0, §5 (binary format) and the fixed-width SIMD opcodes
 * (0xFD prefix: v128.load 0x00, v128.store 0x0B, f64x2.splat 0x14, f64x2.add 0xF0, f64x2.mul 0xF2).
 */

/** Matrix and field arrays that live in one WebAssembly memory, and the row update over them. */
export interface RowUpdateKernel {
  /** The N×N pair matrix (copy of the one given), K. */
  matrix: Float64Array;
  /** Fields array of replica k (length N), K. */
  fields(k: number): Float64Array;
  /** fields(k)[j] += alpha · matrix[i·N + j] for all j. */
  addRow(k: number, i: number, alpha: number): void;
}

// (func (param $dst i32) (param $src i32) (param $n i32) (param $alpha f64)
//   (local $a v128) (local.set $a (f64x2.splat (local.get $alpha)))
//   (block (loop (br_if 1 (i32.eqz (local.get $n)))
//     (v128.store (local.get $dst) (f64x2.add (v128.load (local.get $dst)) (f64x2.mul (v128.load (local.get $src)) (local.get $a))))
//     $dst += 16; $src += 16; $n -= 2; (br 0))))
const BODY = [
  0x01, 0x01, 0x7b,
  0x20, 0x03, 0xfd, 0x14, 0x21, 0x04,
  0x02, 0x40, 0x03, 0x40,
  0x20, 0x02, 0x45, 0x0d, 0x01,
  0x20, 0x00,
  0x20, 0x00, 0xfd, 0x00, 0x03, 0x00,
  0x20, 0x01, 0xfd, 0x00, 0x03, 0x00,
  0x20, 0x04, 0xfd, 0xf2, 0x01,
  0xfd, 0xf0, 0x01,
  0xfd, 0x0b, 0x03, 0x00,
  0x20, 0x00, 0x41, 0x10, 0x6a, 0x21, 0x00,
  0x20, 0x01, 0x41, 0x10, 0x6a, 0x21, 0x01,
  0x20, 0x02, 0x41, 0x02, 0x6b, 0x21, 0x02,
  0x0c, 0x00,
  0x0b, 0x0b, 0x0b,
];
const MODULE = new Uint8Array([
  0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00,
  0x01, 0x08, 0x01, 0x60, 0x04, 0x7f, 0x7f, 0x7f, 0x7c, 0x00, // type (i32 i32 i32 f64) -> ()
  0x02, 0x0c, 0x01, 0x03, 0x65, 0x6e, 0x76, 0x03, 0x6d, 0x65, 0x6d, 0x02, 0x00, 0x01, // import env.mem
  0x03, 0x02, 0x01, 0x00, // one function of type 0
  0x07, 0x08, 0x01, 0x04, 0x61, 0x78, 0x70, 0x79, 0x00, 0x00, // export "axpy"
  0x0a, BODY.length + 2, 0x01, BODY.length, ...BODY,
]);

/** The part of the WebAssembly JS API used here (the project's TypeScript lib has no DOM/WebAssembly types). */
interface WasmApi {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { exports: Record<string, unknown> };
  Memory: new (descriptor: { initial: number }) => { buffer: ArrayBuffer };
}
const WASM = (globalThis as unknown as { WebAssembly?: WasmApi }).WebAssembly;

let compiled: object | null | undefined;

function wasmModule(): object | null {
  if (compiled === undefined) {
    try {
      compiled = WASM && WASM.validate(MODULE) ? new WASM.Module(MODULE) : null;
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

/**
 * Copy the pair matrix (N×N, N even) into a WebAssembly memory with room for `replicas` field arrays, or return
 * undefined when WebAssembly SIMD is unavailable or the sizes do not fit a 32-bit memory.
 * @example const k = createRowUpdateKernel(J, 1024, 16); k?.addRow(0, 5, -2)
 * See also: metropolisSweep, loopMove
 */
export function createRowUpdateKernel(matrixK: Float64Array, N: number, replicas: number): RowUpdateKernel | undefined {
  const mod = wasmModule();
  if (!mod || N % 2 !== 0 || matrixK.length !== N * N) return undefined;
  const bytes = 8 * (N * N + replicas * N);
  if (bytes > 2 ** 31) return undefined;
  try {
    const memory = new WASM!.Memory({ initial: Math.ceil(bytes / 65536) + 1 });
    const instance = new WASM!.Instance(mod, { env: { mem: memory } });
    const axpy = instance.exports.axpy as (dst: number, src: number, n: number, alpha: number) => void;
    const matrix = new Float64Array(memory.buffer, 0, N * N);
    matrix.set(matrixK);
    const fieldBase = 8 * N * N;
    const views = Array.from({ length: replicas }, (_, k) => new Float64Array(memory.buffer, fieldBase + 8 * N * k, N));
    return {
      matrix,
      fields: (k) => views[k],
      addRow: (k, i, alpha) => axpy(fieldBase + 8 * N * k, 8 * N * i, N, alpha),
    };
  } catch {
    return undefined;
  }
}
