import { studentTQuantile } from './distributions';

/** A combination (model + firmware) is reported only when compared with at least this many others. */
export const MINIMUM_PARTNERS = 2;

/** One like-for-like submission: logRatio = ln(ΣA / ΣB) of combination a against combination b. */
export interface ConsensusEdge<Id extends string | number> {
  a: Id;
  b: Id;
  logRatio: number;
  weight: number;
}

export interface ConsensusOffset<Id extends string | number> {
  comboId: Id;
  /** Combinations are compared only within their connected component; each has its own zero level. */
  component: number;
  /** Estimated θ: the combination reads e^θ times the consensus. */
  offsetLog: number;
  offsetPercent: number;
  /** Null when the component has no residual degrees of freedom (a tree of comparisons). */
  standardErrorLog: number | null;
  lowerPercent: number | null;
  upperPercent: number | null;
  /** Number of distinct combinations it has been compared with. */
  connectedTo: number;
  /** connectedTo ≥ MINIMUM_PARTNERS: only these are shown to shoppers. */
  reportable: boolean;
}

export interface ConsensusComponent {
  component: number;
  comboCount: number;
  edgeCount: number;
  /** Edges − (combinations − 1). */
  degreesOfFreedom: number;
  /** √(Σw·residual² / df): the scatter of a unit-weight comparison about the fit. */
  residualSd: number | null;
}

export interface ConsensusFit<Id extends string | number> {
  offsets: ConsensusOffset<Id>[];
  components: ConsensusComponent[];
}

/**
 * Consensus offsets by weighted least squares on the network of comparisons:
 * logRatio_e = θ_a − θ_b + ε_e with Var(ε_e) = σ² / w_e, one θ per combination.
 * Only differences are identified, so each connected component is fixed by the
 * constraint Σ ω_c θ_c = 0 with ω_c the total weight of the comparisons c takes
 * part in (the better-measured combinations define "the consensus").
 *
 * With L the weighted graph Laplacian (the normal matrix), r = Σ w·y signed by
 * end, and u = ω / Σω, the Lagrange conditions Lθ + uλ = r, uᵀθ = 0 give λ = 0
 * (sum the first over all rows: 1ᵀL = 0 and 1ᵀr = 0), so θ solves the positive
 * definite system (L + s·uuᵀ)θ = r for any s > 0, here by Cholesky. With
 * M = (L + s·uuᵀ)⁻¹ one has M·u = 1/s, so Cov(θ̂) = σ²·MLM = σ²(M − 11ᵀ/s);
 * σ² is the weighted residual mean square on edges − (combinations − 1) degrees of
 * freedom, and the interval uses the t distribution on those.
 * (Standard constrained least squares; see e.g. Seber & Lee, Linear Regression
 * Analysis, 2nd ed., 2003, §3.8.) Cost is cubic in a component's size.
 */
export function fitConsensusOffsets<Id extends string | number>(edges: ConsensusEdge<Id>[], confidence = 0.95): ConsensusFit<Id> {
  // A combination compared with itself says nothing about its offset.
  const usable = edges.filter((edge) => edge.a !== edge.b);
  for (const edge of usable) {
    if (!(edge.weight > 0 && Number.isFinite(edge.weight))) {
      throw new RangeError(`edge weight must be positive, got ${edge.weight}`);
    }
    if (!Number.isFinite(edge.logRatio)) throw new RangeError(`edge log ratio must be finite, got ${edge.logRatio}`);
  }

  const network = buildNetwork(usable);
  const offsets: ConsensusOffset<Id>[] = [];
  const components: ConsensusComponent[] = [];
  const edgesByComponent = network.components.map((): ConsensusEdge<Id>[] => []);
  for (const edge of usable) edgesByComponent[network.componentOf[network.index.get(edge.a)!]].push(edge);
  network.components.forEach((members, component) => {
    const memberEdges = edgesByComponent[component];
    const fit = fitComponent(members, memberEdges, network.index, confidence);
    components.push({
      component,
      comboCount: members.length,
      edgeCount: memberEdges.length,
      degreesOfFreedom: fit.degreesOfFreedom,
      residualSd: fit.residualSd,
    });
    members.forEach((combo, local) => {
      const connectedTo = network.partners[combo].size;
      const theta = fit.theta[local];
      const se = fit.standardErrors[local];
      offsets.push({
        comboId: network.ids[combo],
        component,
        offsetLog: theta,
        offsetPercent: toPercent(theta),
        standardErrorLog: se,
        lowerPercent: se === null ? null : toPercent(theta - fit.tQuantile * se),
        upperPercent: se === null ? null : toPercent(theta + fit.tQuantile * se),
        connectedTo,
        reportable: connectedTo >= MINIMUM_PARTNERS,
      });
    });
  });
  offsets.sort((x, y) => network.index.get(x.comboId)! - network.index.get(y.comboId)!);
  return { offsets, components };
}

function toPercent(logRatio: number): number {
  return 100 * Math.expm1(logRatio);
}

interface Network<Id> {
  ids: Id[];
  index: Map<Id, number>;
  partners: Set<number>[];
  componentOf: number[];
  /** Member combination indices of each component, in order of first appearance. */
  components: number[][];
}

function buildNetwork<Id extends string | number>(edges: ConsensusEdge<Id>[]): Network<Id> {
  const ids: Id[] = [];
  const index = new Map<Id, number>();
  const indexOf = (id: Id) => {
    let i = index.get(id);
    if (i === undefined) {
      i = ids.length;
      index.set(id, i);
      ids.push(id);
    }
    return i;
  };
  const pairs = edges.map((edge) => [indexOf(edge.a), indexOf(edge.b)] as const);

  const partners = ids.map(() => new Set<number>());
  const parent = ids.map((_, i) => i);
  const root = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  for (const [a, b] of pairs) {
    partners[a].add(b);
    partners[b].add(a);
    const ra = root(a);
    const rb = root(b);
    if (ra !== rb) parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }

  const componentOfRoot = new Map<number, number>();
  const componentOf: number[] = [];
  const components: number[][] = [];
  ids.forEach((_, i) => {
    const r = root(i);
    let c = componentOfRoot.get(r);
    if (c === undefined) {
      c = components.length;
      componentOfRoot.set(r, c);
      components.push([]);
    }
    componentOf.push(c);
    components[c].push(i);
  });
  return { ids, index, partners, componentOf, components };
}

interface ComponentFit {
  theta: Float64Array;
  standardErrors: (number | null)[];
  degreesOfFreedom: number;
  residualSd: number | null;
  tQuantile: number;
}

function fitComponent<Id extends string | number>(
  members: number[],
  edges: ConsensusEdge<Id>[],
  index: Map<Id, number>,
  confidence: number,
): ComponentFit {
  const n = members.length;
  const local = new Map(members.map((combo, i) => [combo, i]));
  const localOf = (id: Id) => local.get(index.get(id)!)!;

  const normal = new Float64Array(n * n);
  const rhs = new Float64Array(n);
  for (const edge of edges) {
    const a = localOf(edge.a);
    const b = localOf(edge.b);
    normal[a * n + a] += edge.weight;
    normal[b * n + b] += edge.weight;
    normal[a * n + b] -= edge.weight;
    normal[b * n + a] -= edge.weight;
    rhs[a] += edge.weight * edge.logRatio;
    rhs[b] -= edge.weight * edge.logRatio;
  }

  // ω_c is the Laplacian's diagonal; s = its mean keeps s·uuᵀ on the scale of L.
  let totalWeight = 0;
  for (let i = 0; i < n; i++) totalWeight += normal[i * n + i];
  const s = totalWeight / n;
  const system = normal.slice();
  for (let i = 0; i < n; i++) {
    const ui = normal[i * n + i] / totalWeight;
    for (let j = 0; j < n; j++) system[i * n + j] += s * ui * (normal[j * n + j] / totalWeight);
  }

  const factor = cholesky(system, n);
  const theta = solveWithCholesky(factor, n, rhs);

  let residualSumOfSquares = 0;
  for (const edge of edges) {
    const residual = edge.logRatio - theta[localOf(edge.a)] + theta[localOf(edge.b)];
    residualSumOfSquares += edge.weight * residual * residual;
  }
  const degreesOfFreedom = edges.length - (n - 1);
  if (degreesOfFreedom < 1) {
    return { theta, standardErrors: members.map(() => null), degreesOfFreedom, residualSd: null, tQuantile: NaN };
  }
  const residualVariance = residualSumOfSquares / degreesOfFreedom;
  const inverseDiagonal = inverseDiagonalFromCholesky(factor, n);
  return {
    theta,
    standardErrors: Array.from(inverseDiagonal, (m) => Math.sqrt(residualVariance * Math.max(0, m - 1 / s))),
    degreesOfFreedom,
    residualSd: Math.sqrt(residualVariance),
    tQuantile: studentTQuantile(1 - (1 - confidence) / 2, degreesOfFreedom),
  };
}

/** Lower-triangular G with GGᵀ = A, row-major (Cholesky–Banachiewicz order). */
function cholesky(a: Float64Array, n: number): Float64Array {
  const g = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    const rowI = i * n;
    for (let j = 0; j <= i; j++) {
      const rowJ = j * n;
      let sum = a[rowI + j];
      for (let k = 0; k < j; k++) sum -= g[rowI + k] * g[rowJ + k];
      if (i === j) {
        if (!(sum > 0)) throw new Error('consensus normal matrix is not positive definite');
        g[rowI + i] = Math.sqrt(sum);
      } else {
        g[rowI + j] = sum / g[rowJ + j];
      }
    }
  }
  return g;
}

function solveWithCholesky(g: Float64Array, n: number, b: Float64Array): Float64Array {
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let sum = b[i];
    for (let k = 0; k < i; k++) sum -= g[i * n + k] * y[k];
    y[i] = sum / g[i * n + i];
  }
  const x = new Float64Array(n);
  for (let i = n - 1; i >= 0; i--) {
    let sum = y[i];
    for (let k = i + 1; k < n; k++) sum -= g[k * n + i] * x[k];
    x[i] = sum / g[i * n + i];
  }
  return x;
}

/** diag(A⁻¹) = squared column norms of G⁻¹, one forward substitution G·x = e_c per column. */
function inverseDiagonalFromCholesky(g: Float64Array, n: number): Float64Array {
  const diagonal = new Float64Array(n);
  const x = new Float64Array(n);
  for (let c = 0; c < n; c++) {
    let norm = 0;
    for (let i = c; i < n; i++) {
      let sum = i === c ? 1 : 0;
      for (let k = c; k < i; k++) sum -= g[i * n + k] * x[k];
      x[i] = sum / g[i * n + i];
      norm += x[i] * x[i];
    }
    diagonal[c] = norm;
  }
  return diagonal;
}
