// packages/cells/src/kinds/curieWeiss.ts
import { defineKind } from '@multiplet/cells/kinds/types';
import { htmlTable, textTable, formatQuantity } from '@multiplet/cells/render/format';
import { CURIE_PREFACTOR_EMU_K_PER_MOL } from '@multiplet/physics/units';
import { getIon } from '@multiplet/physics/ions';

interface Input { temperatures: number[]; thetaCW: number; }
interface Result { temperaturesK: number[]; chiEmuPerMol: number[]; }

export const curieWeissKind = defineKind<Input, Result>({
  kind: 'curie-weiss',
  summary: 'free-ion Curie-Weiss susceptibility of the sample ion',
  fields: {
    temperatures: { type: 'range', unit: 'K', min: 0, required: true, doc: 'Temperatures, e.g. "2 K .. 300 K / 50".' },
    thetaCW: { type: 'quantity', unit: 'K', default: '0 K', doc: 'Weiss temperature θ_CW.',
               control: { min: -50, max: 50, step: 0.5 } },   // a live slider in JupyterLab
  },
  reads: ['sample'],          // the current [sample] becomes a dependency; 'references' if it has reference fields
  writes: 'result',           // 'sample' | 'dataset' | 'result'
  check(input, ctx) {         // optional cross-field checks, after every field was coerced
    if (input.temperatures.some((t) => t <= input.thetaCW)) ctx.fail('temperatures', input.temperatures, 'T > θ_CW');
  },
  run(input, ctx) {           // numbers in the schema's units; return plain JSON (typed arrays are converted)
    const ion = getIon(ctx.sample().ion);
    const curie = CURIE_PREFACTOR_EMU_K_PER_MOL * ion.gJ ** 2 * ion.J * (ion.J + 1);
    ctx.task.checkpoint();    // long loops: ctx.task.report(done, total) and ctx.task.checkpoint()
    return { temperaturesK: input.temperatures, chiEmuPerMol: input.temperatures.map((t) => curie / (t - input.thetaCW)) };
  },
  render(result, info) {
    const columns = [{ name: 'T', unit: 'K' }, { name: 'χ', unit: 'emu/mol' }];
    const rows = result.temperaturesK.map((t, i) => [t, result.chiEmuPerMol[i]!]);
    return {
      text: `${info.name}: χ at ${formatQuantity(result.temperaturesK[0]!, 'K')} …\n${textTable(columns, rows, 5)}`,
      html: htmlTable(info.name, columns, rows),
      vegaLite: {
        $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
        data: { values: rows.map(([t, chi]) => ({ t, chi })) },
        mark: 'line',
        encoding: { x: { field: 't', type: 'quantitative', title: 'T (K)' },
                    y: { field: 'chi', type: 'quantitative', title: 'χ (emu/mol)' } },
      },
    };
  },
});
