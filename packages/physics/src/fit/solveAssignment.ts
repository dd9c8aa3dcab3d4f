/**
 * Minimum-cost assignment of rows to distinct columns (rows ≤ columns): the Hungarian method (Kuhn 1955; Munkres
 * 1957) in its O(n²m) shortest-augmenting-path form with row and column potentials (Jonker & Volgenant 1987; Burkard,
 * Dell'Amico & Martello, "Assignment Problems", 2009, §4.4). Used to assign observed peaks to computed transitions.
 *
 * @example solveAssignment([[1, 5], [4, 2]]) // [0, 1]
 * See also: assignPeaks.
 */
import { InputError } from '../errors';

/** Returns, for each row, the column it is assigned to, minimising the summed cost. Costs must be finite. */
export function solveAssignment(cost: ReadonlyArray<ArrayLike<number>>): number[] {
  const n = cost.length;
  if (n === 0) return [];
  const m = cost[0].length;
  if (m < n) throw new InputError('cost', `${n}×${m}`, 'at least as many columns as rows');
  for (let i = 0; i < n; i++) {
    if (cost[i].length !== m) throw new InputError(`cost[${i}]`, cost[i].length, `${m} columns`);
    for (let j = 0; j < m; j++) if (!Number.isFinite(cost[i][j])) throw new InputError(`cost[${i}][${j}]`, cost[i][j], 'a finite number');
  }
  // 1-based arrays as in the classical formulation; column 0 is a virtual start.
  const u = new Float64Array(n + 1);
  const v = new Float64Array(m + 1);
  const rowOfColumn = new Int32Array(m + 1);
  const way = new Int32Array(m + 1);
  for (let i = 1; i <= n; i++) {
    rowOfColumn[0] = i;
    let j0 = 0;
    const minv = new Float64Array(m + 1).fill(Infinity);
    const used = new Uint8Array(m + 1);
    do {
      used[j0] = 1;
      const i0 = rowOfColumn[j0];
      let delta = Infinity;
      let j1 = 0;
      for (let j = 1; j <= m; j++) {
        if (used[j]) continue;
        const reduced = cost[i0 - 1][j - 1] - u[i0] - v[j];
        if (reduced < minv[j]) {
          minv[j] = reduced;
          way[j] = j0;
        }
        if (minv[j] < delta) {
          delta = minv[j];
          j1 = j;
        }
      }
      for (let j = 0; j <= m; j++) {
        if (used[j]) {
          u[rowOfColumn[j]] += delta;
          v[j] -= delta;
        } else {
          minv[j] -= delta;
        }
      }
      j0 = j1;
    } while (rowOfColumn[j0] !== 0);
    do {
      const j1 = way[j0];
      rowOfColumn[j0] = rowOfColumn[j1];
      j0 = j1;
    } while (j0 !== 0);
  }
  const assignment = new Array<number>(n).fill(-1);
  for (let j = 1; j <= m; j++) if (rowOfColumn[j] !== 0) assignment[rowOfColumn[j] - 1] = j - 1;
  return assignment;
}
