/**
 * Pyrochlore lattice: 16d sites (origin choice 2 of Fd-3m), local ⟨111⟩ frames, neighbour shells J1/J2/J3a/J3b,
 * periodic supercells with their tetrahedra, and Ewald dipolar sums. Conventions: see `pyrochlore.ts`.
 */
export * from './pyrochlore';
export * from './localFrames';
export * from './neighbourShells';
export * from './supercell';
export * from './supercellNeighbourLists';
export * from './erfc';
export * from './ewaldDipolarKernel';
export * from './pyrochloreDipolarMatrix';
