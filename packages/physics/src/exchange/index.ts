/**
 * Effective pseudospin-1/2 exchange between rare-earth ions from their CEF eigenstates: microscopic couplings
 * (isotropic, anisotropic, dipolar), first- and second-order projection on the ground doublets, the anisotropic
 * nearest-neighbour couplings J_zz, J_±, J_±±, J_z± with bond phases, exact two-site checks, scans.
 * Conventions: pseudospinSite.ts (doublet basis), bondGeometry.ts (phases), pseudospinCouplings.ts (form).
 */
export * from './pseudospinSite';
export * from './bondGeometry';
export * from './microscopicCoupling';
export * from './pseudospinCouplings';
export * from './effectiveExchange';
export { frameRows, toLocalFrames, toGlobalFrame, type Matrix3 } from './matrix3';
export * from './exchangeScan';
export * from './curieWeiss';
export * from './multiSite';
export * from './furtherNeighbourExchange';
export * from './isingCouplingMap';
