/**
 * Test-only angular-momentum coupling helpers, written independently of the library (Racah's formula for the
 * Wigner 3j symbol: Edmonds, Angular Momentum in Quantum Mechanics (1957), ch. 3; Clebsch–Gordan via
 * its 3j form). Arguments may be half-integers.
 */
function factorial(n: number): number {
  if (n < 0 || !Number.isInteger(Math.round(n * 2) / 2)) throw new Error(`factorial of ${n}`);
  let r = 1;
  for (let i = 2; i <= Math.round(n); i++) r *= i;
  return r;
}

export function wigner3j(j1: number, j2: number, j3: number, m1: number, m2: number, m3: number): number {
  if (Math.abs(m1 + m2 + m3) > 1e-9) return 0;
  if (j3 < Math.abs(j1 - j2) || j3 > j1 + j2) return 0;
  if (Math.abs(m1) > j1 || Math.abs(m2) > j2 || Math.abs(m3) > j3) return 0;
  const delta = (factorial(j1 + j2 - j3) * factorial(j1 - j2 + j3) * factorial(-j1 + j2 + j3)) / factorial(j1 + j2 + j3 + 1);
  const pre = Math.sqrt(
    delta * factorial(j1 + m1) * factorial(j1 - m1) * factorial(j2 + m2) * factorial(j2 - m2) * factorial(j3 + m3) * factorial(j3 - m3),
  );
  let sum = 0;
  for (let k = 0; k <= j1 + j2 + j3 + 1; k++) {
    const args = [k, j3 - j2 + k + m1, j3 - j1 + k - m2, j1 + j2 - j3 - k, j1 - k - m1, j2 - k + m2];
    if (args.some((a) => a < -1e-9)) continue;
    sum += (k % 2 ? -1 : 1) / args.reduce((p, a) => p * factorial(a), 1);
  }
  const phase = Math.round(j1 - j2 - m3) % 2 === 0 ? 1 : -1;
  return phase * pre * sum;
}

export function clebschGordan(j1: number, m1: number, j2: number, m2: number, J: number, M: number): number {
  const phase = Math.round(j1 - j2 + M) % 2 === 0 ? 1 : -1;
  return phase * Math.sqrt(2 * J + 1) * wigner3j(j1, j2, J, m1, m2, -M);
}
