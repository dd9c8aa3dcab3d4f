/**
 * The `physics` object in script cells: the public modules of @multiplet/physics by name
 * (`physics.units.BOLTZMANN_MEV_PER_K`, `physics.ions.getIon('Dy3+')`, `physics.random.createRandom(1)`, ...).
 * Add a module here when it gains an index.ts.
 */
import * as cef from '@multiplet/physics/cef';
import * as errors from '@multiplet/physics/errors';
import * as fit from '@multiplet/physics/fit';
import * as ions from '@multiplet/physics/ions';
import * as linalg from '@multiplet/physics/linalg';
import * as progress from '@multiplet/physics/progress';
import * as quadrature from '@multiplet/physics/quadrature';
import * as random from '@multiplet/physics/random';
import * as units from '@multiplet/physics/units';

export const PHYSICS_SCOPE = Object.freeze({ cef, errors, fit, ions, linalg, progress, quadrature, random, units });
