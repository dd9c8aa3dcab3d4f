/**
 * The `physics` object in script cells: the public modules of @multiplet/physics by name
 * (`physics.units.BOLTZMANN_MEV_PER_K`, `physics.ions.getIon('Dy3+')`, `physics.cef.solveCef(...)`,
 * `physics.random.createRandom(1)`, ...). Add a module here when it gains an index.ts.
 */
import * as cef from '@multiplet/physics/cef';
import * as errors from '@multiplet/physics/errors';
import * as exchange from '@multiplet/physics/exchange';
import * as fit from '@multiplet/physics/fit';
import * as ions from '@multiplet/physics/ions';
import * as lattice from '@multiplet/physics/lattice';
import * as linalg from '@multiplet/physics/linalg';
import * as montecarlo from '@multiplet/physics/montecarlo';
import * as neutron from '@multiplet/physics/neutron';
import * as progress from '@multiplet/physics/progress';
import * as quadrature from '@multiplet/physics/quadrature';
import * as random from '@multiplet/physics/random';
import * as scattering from '@multiplet/physics/scattering';
import * as thermo from '@multiplet/physics/thermo';
import * as units from '@multiplet/physics/units';

export const PHYSICS_SCOPE = Object.freeze({
  cef,
  errors,
  exchange,
  fit,
  ions,
  lattice,
  linalg,
  montecarlo,
  neutron,
  progress,
  quadrature,
  random,
  scattering,
  thermo,
  units,
});
