import { createCellSession, type MultipletSession, type CellOutput, type ExecuteOutcome } from '@multiplet/cells';

export const SAMPLE_CELL = `[sample] host
compound: DyQ-1
ion: Dy3+
siteSymmetry: D3d
latticeConstant: 10.12 angstrom
ionsPerFormulaUnit: 2
molarMass: 532.8 g/mol
`;

export const CEF_CELL = `[crystal-field] cefA
B:
  B20: -0.35 meV
  B40: 1.2e-3 meV
  B43: 0.01 meV
`;

export interface Run {
  outcome: ExecuteOutcome;
  outputs: CellOutput[];
}

export async function run(session: MultipletSession, code: string, cancelFlag?: Int32Array): Promise<Run> {
  const outputs: CellOutput[] = [];
  const outcome = await session.execute(code, { emit: (o) => outputs.push(o), cancelFlag });
  return { outcome, outputs };
}

export async function runOk(session: MultipletSession, code: string): Promise<Run & { data: Record<string, unknown> }> {
  const r = await run(session, code);
  if (r.outcome.status !== 'ok') throw new Error(`cell failed: ${r.outcome.evalue}`);
  return { ...r, data: r.outcome.result?.data ?? {} };
}

export function errorOf(r: Run): { ename: string; evalue: string; traceback: string[] } {
  if (r.outcome.status !== 'error') throw new Error('expected an error, cell succeeded');
  return r.outcome;
}

export { createCellSession };
