/**
 * Quadrature on the unit sphere: Lebedev–Laikov grids (powder averages), the inversion half of a grid, and the
 * Fibonacci grid used as a plain reference.
 */
export type { SphereGrid } from './sphereGrid';
export { lebedevGrid, LEBEDEV_DEGREES } from './lebedevGrid';
export { inversionHalf } from './inversionHalf';
export { fibonacciGrid } from './fibonacciGrid';
