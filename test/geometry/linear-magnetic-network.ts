// Test helper (not a test file): a linear magnetic network solved by nodal
// analysis with ml-matrix, independent of the geometry code under test.
// Branch u -> v with reluctance R and MMF source F (driving flux from u to v):
// phi = (F + P_u - P_v) / R; flux conservation at every node except a reference.
import { Matrix, solve } from 'ml-matrix';
import { pathReluctance, type CoreLayout } from '../../src/index.js';

export interface Branch {
  readonly name: string;
  readonly from: string;
  readonly to: string;
  readonly reluctance: number;
}

/** Branch fluxes for MMF sources given by branch name (A). */
export function branchFluxes(nodes: readonly string[], branches: readonly Branch[], mmf: ReadonlyMap<string, number>): Map<string, number> {
  const index = new Map(nodes.slice(1).map((n, i) => [n, i] as const)); // nodes[0] is the reference
  const m = nodes.length - 1;
  const y = Matrix.zeros(m, m);
  const rhs = Matrix.zeros(m, 1);
  for (const b of branches) {
    const g = 1 / b.reluctance;
    const f = mmf.get(b.name) ?? 0;
    const u = index.get(b.from);
    const v = index.get(b.to);
    if (u !== undefined) {
      y.set(u, u, y.get(u, u) + g);
      rhs.set(u, 0, rhs.get(u, 0) - g * f);
    }
    if (v !== undefined) {
      y.set(v, v, y.get(v, v) + g);
      rhs.set(v, 0, rhs.get(v, 0) + g * f);
    }
    if (u !== undefined && v !== undefined) {
      y.set(u, v, y.get(u, v) - g);
      y.set(v, u, y.get(v, u) - g);
    }
  }
  const p = solve(y, rhs);
  const pot = (n: string): number => {
    const i = index.get(n);
    return i === undefined ? 0 : p.get(i, 0);
  };
  return new Map(branches.map((b) => [b.name, ((mmf.get(b.name) ?? 0) + pot(b.from) - pot(b.to)) / b.reluctance]));
}

/** The layout as linear branches for a core of relative permeability mu_r. */
export function layoutBranches(layout: CoreLayout, relativePermeability: number): Branch[] {
  return layout.paths.map((p) => ({ name: p.name, from: p.from, to: p.to, reluctance: pathReluctance(p, relativePermeability) }));
}

/**
 * Inductance matrix of windings (turns on named paths, positive along the
 * path): L_ij = N_i N_j phi_i / F_j with a unit MMF F_j on winding j's path.
 */
export function inductanceMatrix(
  layout: CoreLayout,
  relativePermeability: number,
  windings: readonly { readonly path: string; readonly turns: number }[],
): number[][] {
  const branches = layoutBranches(layout, relativePermeability);
  return windings.map((wi) =>
    windings.map((wj) => {
      const phi = branchFluxes(layout.nodes, branches, new Map([[wj.path, 1]]));
      return wi.turns * wj.turns * (phi.get(wi.path) ?? Number.NaN);
    }),
  );
}
