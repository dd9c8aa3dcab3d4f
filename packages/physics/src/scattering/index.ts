/**
 * Magnetic diffuse neutron scattering of Ising spin configurations in absolute units (barn/sr per ion): pair
 * correlation shells, Blech–Averbach powder average, single-crystal planes with the perpendicular projection,
 * finite clusters, and normalisation of data from the paramagnetic scattering.
 */
export * from './pairCorrelationShells';
export * from './powderIntensity';
export * from './clusterIntensity';
export * from './singleCrystalIntensity';
export * from './normalizeToParamagnet';
