/**
 * Classical Ising Monte Carlo of spin ice on the pyrochlore lattice (exchange J1/J2/J3a/J3b, Ewald dipolar sum,
 * Zeeman term) with single-spin Metropolis, loop moves and parallel tempering; thermodynamics with error bars,
 * entropy by thermodynamic integration, the q = (001) order parameter, Ferrenberg–Swendsen reweighting and fits of
 * exchange constants to heat capacity.
 */
export * from './spinIceCouplings';
export * from './replicaState';
export * from './metropolisSweep';
export * from './loopMove';
export * from './orderParameter001';
export * from './heatCapacityJackknife';
export * from './entropyByIntegration';
export * from './spinIceSimulation';
export * from './summarizeSpinIceRun';
export * from './runSpinIceMonteCarlo';
export * from './multiHistogramReweighting';
export * from './reweightedHeatCapacity';
export * from './spinIceRunData';
export * from './runSpinIceMonteCarloAsync';
export * from './fitHeatCapacity';
export * from './rowUpdateKernel';
