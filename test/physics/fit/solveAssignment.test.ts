import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { solveAssignment } from '@multiplet/physics/fit/solveAssignment';
import { InputError } from '@multiplet/physics/errors';

function bruteForceMinimum(cost: number[][]): number {
  const n = cost.length;
  const m = cost[0].length;
  let best = Infinity;
  const used = new Array<boolean>(m).fill(false);
  const go = (row: number, sum: number): void => {
    if (row === n) {
      best = Math.min(best, sum);
      return;
    }
    for (let j = 0; j < m; j++) {
      if (used[j]) continue;
      used[j] = true;
      go(row + 1, sum + cost[row][j]);
      used[j] = false;
    }
  };
  go(0, 0);
  return best;
}

describe('solveAssignment', () => {
  it('solves a textbook 3×3 case', () => {
    expect(solveAssignment([[4, 1, 3], [2, 0, 5], [3, 2, 2]])).toEqual([1, 0, 2]);
  });

  it('matches brute force on random rectangular problems (rows ≤ columns)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 5 }).chain((n) =>
          fc.integer({ min: n, max: 6 }).chain((m) =>
            fc.array(fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: m, maxLength: m }), { minLength: n, maxLength: n }),
          ),
        ),
        (cost) => {
          const assignment = solveAssignment(cost);
          expect(new Set(assignment).size).toBe(cost.length);
          const total = assignment.reduce((s, j, i) => s + cost[i][j], 0);
          expect(total).toBeCloseTo(bruteForceMinimum(cost), 9);
        },
      ),
      { numRuns: 200, seed: 11 },
    );
  });

  it('rejects more rows than columns and non-finite costs', () => {
    expect(() => solveAssignment([[1], [2]])).toThrow(InputError);
    expect(() => solveAssignment([[Number.NaN, 1]])).toThrow(InputError);
  });
});
