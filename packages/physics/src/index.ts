/**
 * @multiplet/physics: the compute package. Pure TypeScript (no I/O, no DOM); runs in Node, browsers and workers.
 * Each module is its own namespace here; import a module directly (`@multiplet/physics/cef`) for a smaller bundle.
 * Units and conventions: DEVELOPERS.md § Conventions.
 */
export * as cef from './cef';
export * as errors from './errors';
export * as exchange from './exchange';
export * as fit from './fit';
export * as ions from './ions';
export * as lattice from './lattice';
export * as linalg from './linalg';
export * as montecarlo from './montecarlo';
export * as neutron from './neutron';
export * as progress from './progress';
export * as quadrature from './quadrature';
export * as random from './random';
export * as scattering from './scattering';
export * as thermo from './thermo';
export * as units from './units';
