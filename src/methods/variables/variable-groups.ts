// Summaries of a cut of a variable tree. For each group: its members, the share of the group's
// variance its first principal component explains (largest eigenvalue of the members'
// correlation matrix over their number), and a representative member.
//
// The representative minimises the 1 − R² ratio of the variable clustering literature
// (SAS/STAT User's Guide, "The VARCLUS Procedure", SAS Institute — from memory):
//   unexplainedRatio = (1 − R²own) / (1 − R²next)
// R²own: squared correlation of the column with its own group's first component;
// R²next: the largest squared correlation with another group's first component. Small means
// well summarised by its own group and little tied to the others. Ties: the earlier column.
// Everything follows from the correlation matrix R: with v the unit eigenvector and λ the
// eigenvalue of a group's block, corr(column j, component) = (R v)_j / √λ.
import { symmetricEigen } from '../project/eigen';

export interface VariableMember {
  readonly name: string;
  /** Squared correlation with its own group's first principal component. */
  readonly sharedWithOwn: number;
  /** Largest squared correlation with another group's first component (0 with one group). */
  readonly sharedWithNext: number;
  /** Number (1-based) of that other group, or null with one group. */
  readonly nextGroup: number | null;
  /** (1 − sharedWithOwn) / (1 − sharedWithNext): smaller is a better representative. */
  readonly unexplainedRatio: number;
}

export interface VariableGroup {
  /** 1-based, numbered as the tree's cut numbers them (by the first column in input order). */
  readonly group: number;
  readonly members: readonly VariableMember[];
  /** Share of the members' total (standardised) variance explained by their first component. */
  readonly firstComponentShare: number;
  /** Name of the member with the smallest unexplainedRatio. */
  readonly representative: string;
}

interface Component {
  members: number[];
  vector: Float64Array;
  value: number;
}

function firstComponent(r: Float64Array, p: number, members: number[]): Component {
  const q = members.length;
  const block = new Float64Array(q * q);
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) block[a * q + b] = r[members[a] * p + members[b]];
  const e = symmetricEigen(block, q);
  const vector = new Float64Array(q);
  for (let a = 0; a < q; a++) vector[a] = e.vectors[a * q];
  return { members, vector, value: e.values[0] };
}

/** Squared correlation of column j with a group's first component. */
function sharedWith(r: Float64Array, p: number, j: number, c: Component): number {
  let s = 0;
  for (let a = 0; a < c.members.length; a++) s += r[j * p + c.members[a]] * c.vector[a];
  return Math.min(1, (s * s) / c.value);
}

export function summariseGroups(r: Float64Array, names: readonly string[], assignment: Int32Array): VariableGroup[] {
  const p = names.length;
  let k = 0;
  for (const g of assignment) k = Math.max(k, g + 1);
  const memberLists: number[][] = Array.from({ length: k }, () => []);
  assignment.forEach((g, j) => memberLists[g].push(j));
  const components = memberLists.map((m) => firstComponent(r, p, m));
  return components.map((own, g) => {
    const members: VariableMember[] = own.members.map((j) => {
      const sharedWithOwn = sharedWith(r, p, j, own);
      let sharedWithNext = 0;
      let nextGroup: number | null = null;
      components.forEach((other, h) => {
        if (h === g) return;
        const s = sharedWith(r, p, j, other);
        if (nextGroup === null || s > sharedWithNext) {
          sharedWithNext = s;
          nextGroup = h + 1;
        }
      });
      // A column equal to another group's component (R² = 1) cannot be judged: ratio Infinity.
      const unexplainedRatio = sharedWithNext >= 1 ? Infinity : (1 - sharedWithOwn) / (1 - sharedWithNext);
      return { name: names[j], sharedWithOwn, sharedWithNext, nextGroup, unexplainedRatio };
    });
    let best = 0;
    for (let a = 1; a < members.length; a++) if (members[a].unexplainedRatio < members[best].unexplainedRatio) best = a;
    return {
      group: g + 1,
      members,
      firstComponentShare: Math.min(1, own.value / own.members.length),
      representative: members[best].name,
    };
  });
}
