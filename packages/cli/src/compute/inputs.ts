// Input helpers shared by the compute kinds (one place for field checks, optional values and the ion + Stevens
// parameter block); each kind keeps only what is its own.
import { InputError } from '@multiplet/physics/errors';
import { getIon } from '@multiplet/physics/ions';
import { normalizeCefParameters } from '@multiplet/physics/cef';
import type { Demagnetization, SingleIonInput } from '@multiplet/physics/thermo';
import type { CefParameters } from '@multiplet/physics/cef';
import type { Ion } from '@multiplet/physics/ions';

/** Reject keys that are not fields of this kind (a typo must not be silently ignored). */
export function checkFields(input: Record<string, unknown>, fields: readonly string[]): void {
  for (const key of Object.keys(input)) if (!fields.includes(key)) throw new InputError(key, input[key], `no such field; fields are ${fields.join(', ')}`);
}

/** How a kind reads its ion and Stevens parameters (the defaults are those of the thermodynamics kinds). */
export interface CefInputOptions {
  /** B must be given (default false: no B means no crystal field). */
  requireB?: boolean;
  /** The example in the error for a missing ion (default "Dy3+"). */
  ionExample?: string;
  /** What the error for a B that is not an object expects. */
  expectedB?: string;
}

/** ion + B (+ unit, symmetry) → the ion and its Stevens parameters in meV (checked in this order). */
export function readCefInput(input: Record<string, unknown>, options: CefInputOptions = {}): { ion: Ion; parametersMeV: CefParameters } {
  if (input.ion === undefined) throw new InputError('ion', undefined, `an ion name such as "${options.ionExample ?? 'Dy3+'}"`);
  const ion = getIon(input.ion as string);
  const B = input.B === undefined && !options.requireB ? {} : input.B;
  if (B === undefined || B === null || typeof B !== 'object' || Array.isArray(B))
    throw new InputError('B', B, options.expectedB ?? 'an object of Stevens parameters, e.g. {"B20": -0.2, "B40": 0.001}');
  const parametersMeV = normalizeCefParameters(B as Record<string, unknown>, {
    unit: optionalString(input, 'unit'),
    symmetry: optionalString(input, 'symmetry'),
    field: 'B',
  });
  return { ion, parametersMeV };
}

/** ion + B (+ unit, symmetry) → the ion's J, g_J and Stevens parameters in meV (no B: no crystal field). */
export function readIon(input: Record<string, unknown>): { name: string; single: SingleIonInput } {
  const { ion, parametersMeV } = readCefInput(input);
  return { name: ion.name, single: { J: ion.J, gJ: ion.gJ, parametersMeV } };
}

export function optionalString(input: Record<string, unknown>, key: string): string | undefined {
  const v = input[key];
  if (v === undefined) return undefined;
  if (typeof v !== 'string') throw new InputError(key, v, 'a string');
  return v;
}

export function optionalNumber(input: Record<string, unknown>, key: string): number | undefined {
  const v = input[key];
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new InputError(key, v, 'a finite number');
  return v;
}

/** An optional integer ≥ min; `path` names it in errors (default: key). */
export function optionalInteger(input: Record<string, unknown>, key: string, min: number, path = key): number | undefined {
  const v = input[key];
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min) throw new InputError(path, v, `an integer ≥ ${min}`);
  return v;
}

/** A required non-empty array of numbers (the physics functions check signs and finiteness per element). */
export function requiredArray(input: Record<string, unknown>, key: string, what: string): number[] {
  const v = input[key];
  if (!Array.isArray(v) || v.length === 0) throw new InputError(key, v, `a non-empty array of ${what}`);
  return v as number[];
}

/** direction: [x, y, z] or "powder". */
export function readDirection(input: Record<string, unknown>): [number, number, number] | 'powder' {
  const d = input.direction;
  if (d === 'powder') return 'powder';
  if (Array.isArray(d) && d.length === 3 && d.every((x) => typeof x === 'number' && Number.isFinite(x))) return d as [number, number, number];
  throw new InputError('direction', d, 'a direction [x, y, z] in the crystal frame, or "powder"');
}

/** sites: "single" (default) or "pyrochlore". */
export function readSites(input: Record<string, unknown>): 'single' | 'pyrochlore' {
  const s = input.sites ?? 'single';
  if (s !== 'single' && s !== 'pyrochlore') throw new InputError('sites', s, '"single" or "pyrochlore"');
  return s;
}

/** meanFieldMolPerEmu (λ, mol/emu per mole of ions) and demagnetization, as magnetization and susceptibility take them. */
export function readMeanField(input: Record<string, unknown>): { meanFieldMolPerEmu: number | undefined; demagnetization: Demagnetization | undefined } {
  return {
    meanFieldMolPerEmu: optionalNumber(input, 'meanFieldMolPerEmu'),
    demagnetization: input.demagnetization as Demagnetization | undefined,
  };
}

/** Float64Array → plain array for JSON. */
export const plain = (a: ArrayLike<number>): number[] => Array.from(a);
