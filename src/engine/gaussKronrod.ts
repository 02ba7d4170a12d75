/**
 * Adaptive Gauss-Kronrod (7-point Gauss, 15-point Kronrod) quadrature of a vector integrand.
 * Method and error estimate: QUADPACK QAG with QK15 (Piessens, de Doncker-Kapenga, Ueberhuber & Kahaner 1983).
 * Global subdivision: the interval whose error most exceeds its share is bisected until every component meets
 * max(epsAbs, epsRel * |integral|). Nodes are interior, so integrable end-point singularities are never evaluated.
 */

// QK15 abscissae and weights (QUADPACK qk15.f).
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0.0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327,
];
/** The 7-point Gauss-Legendre rule embedded in QK15 (nodes XGK[1], XGK[3], XGK[5], 0; weights WG), on [-1, 1]. */
export const GAUSS7 = {
  nodes: [-XGK[1], -XGK[3], -XGK[5], 0, XGK[5], XGK[3], XGK[1]],
  weights: [WG[0], WG[1], WG[2], WG[3], WG[2], WG[1], WG[0]],
} as const;

const EPMACH = Number.EPSILON;
const UFLOW = Number.MIN_VALUE;

/** Fills out[0..k-1] with the integrand's components at x. */
export type VectorIntegrand = (x: number, out: Float64Array) => void;

export class QuadratureError extends Error {}

/** Reusable integrator for k-component integrands; holds its own scratch space. */
export class GaussKronrodIntegrator {
  readonly components: number;
  readonly maxIntervals: number;
  private readonly f1: Float64Array;
  private readonly f2: Float64Array;
  private readonly fc: Float64Array;
  private readonly resk: Float64Array;
  private readonly resg: Float64Array;
  private readonly resabs: Float64Array;
  private readonly resasc: Float64Array;
  private readonly fvals: Float64Array;
  // Interval store for subdivision: left, right, then k results and k errors per interval.
  private lo: Float64Array;
  private hi: Float64Array;
  private res: Float64Array;
  private err: Float64Array;

  constructor(components: number, maxIntervals = 4000) {
    this.components = components;
    this.maxIntervals = maxIntervals;
    this.f1 = new Float64Array(components);
    this.f2 = new Float64Array(components);
    this.fc = new Float64Array(components);
    this.resk = new Float64Array(components);
    this.resg = new Float64Array(components);
    this.resabs = new Float64Array(components);
    this.resasc = new Float64Array(components);
    this.fvals = new Float64Array(components * 15);
    this.lo = new Float64Array(64);
    this.hi = new Float64Array(64);
    this.res = new Float64Array(64 * components);
    this.err = new Float64Array(64 * components);
  }

  /** One QK15 rule on [a, b]; writes k results and k error estimates at offset. */
  private rule(
    f: VectorIntegrand,
    a: number,
    b: number,
    result: Float64Array,
    error: Float64Array,
    offset: number,
  ): void {
    const k = this.components;
    const centr = 0.5 * (a + b);
    const hlgth = 0.5 * (b - a);
    const { f1, f2, fc, resk, resg, resabs, resasc, fvals } = this;
    f(centr, fc);
    for (let c = 0; c < k; c++) {
      resg[c] = fc[c] * WG[3];
      resk[c] = fc[c] * WGK[7];
      resabs[c] = Math.abs(resk[c]);
      fvals[14 * k + c] = fc[c];
    }
    for (let j = 0; j < 7; j++) {
      const absc = hlgth * XGK[j];
      f(centr - absc, f1);
      f(centr + absc, f2);
      const gauss = j & 1; // XGK[1], XGK[3], XGK[5] are the Gauss nodes
      for (let c = 0; c < k; c++) {
        const s = f1[c] + f2[c];
        resk[c] += WGK[j] * s;
        resabs[c] += WGK[j] * (Math.abs(f1[c]) + Math.abs(f2[c]));
        if (gauss) resg[c] += WG[(j - 1) >> 1] * s;
        fvals[2 * j * k + c] = f1[c];
        fvals[(2 * j + 1) * k + c] = f2[c];
      }
    }
    const ah = Math.abs(hlgth);
    for (let c = 0; c < k; c++) {
      const reskh = 0.5 * resk[c];
      let asc = WGK[7] * Math.abs(fvals[14 * k + c] - reskh);
      for (let j = 0; j < 7; j++) {
        asc += WGK[j] * (Math.abs(fvals[2 * j * k + c] - reskh) + Math.abs(fvals[(2 * j + 1) * k + c] - reskh));
      }
      resasc[c] = asc * ah;
      const rabs = resabs[c] * ah;
      let e = Math.abs((resk[c] - resg[c]) * hlgth);
      if (resasc[c] !== 0 && e !== 0) {
        const x = (200 * e) / resasc[c];
        e = resasc[c] * Math.min(1, x * Math.sqrt(x)); // x^1.5
      }
      if (rabs > UFLOW / (50 * EPMACH)) e = Math.max(EPMACH * 50 * rabs, e);
      result[offset + c] = resk[c] * hlgth;
      error[offset + c] = e;
    }
  }

  private grow(): void {
    const n = this.lo.length * 2;
    const k = this.components;
    const lo = new Float64Array(n);
    lo.set(this.lo);
    this.lo = lo;
    const hi = new Float64Array(n);
    hi.set(this.hi);
    this.hi = hi;
    const res = new Float64Array(n * k);
    res.set(this.res);
    this.res = res;
    const err = new Float64Array(n * k);
    err.set(this.err);
    this.err = err;
  }

  /**
   * Integrates f over [a, b]; writes the k integrals into `value` and their error estimates into `error`.
   * epsRel is raised to 50 machine epsilons at least (QUADPACK's floor).
   * Throws QuadratureError when the tolerance is not met within maxIntervals subdivisions or a value is not finite.
   */
  integrate(
    f: VectorIntegrand,
    a: number,
    b: number,
    epsRel: number,
    epsAbs: number,
    value: Float64Array,
    error: Float64Array,
  ): void {
    const k = this.components;
    // As QUADPACK: a relative tolerance below 50 machine epsilons cannot be met; ask for that floor instead.
    epsRel = Math.max(epsRel, 50 * EPMACH);
    if (a === b) {
      for (let c = 0; c < k; c++) {
        value[c] = 0;
        error[c] = 0;
      }
      return;
    }
    this.rule(f, a, b, value, error, 0);
    let done = true;
    for (let c = 0; c < k; c++) {
      if (!(error[c] <= Math.max(epsAbs, epsRel * Math.abs(value[c])))) {
        done = false;
        break;
      }
    }
    if (done) return;
    // Subdivide.
    let n = 1;
    this.lo[0] = a;
    this.hi[0] = b;
    for (let c = 0; c < k; c++) {
      this.res[c] = value[c];
      this.err[c] = error[c];
    }
    for (;;) {
      // Totals and the worst interval.
      for (let c = 0; c < k; c++) {
        value[c] = 0;
        error[c] = 0;
      }
      for (let i = 0; i < n; i++) {
        for (let c = 0; c < k; c++) {
          value[c] += this.res[i * k + c];
          error[c] += this.err[i * k + c];
        }
      }
      let ok = true;
      for (let c = 0; c < k; c++) {
        if (!Number.isFinite(value[c])) throw new QuadratureError(`integral is not finite on [${a}, ${b}]`);
        if (!(error[c] <= Math.max(epsAbs, epsRel * Math.abs(value[c])))) ok = false;
      }
      if (ok) return;
      if (n >= this.maxIntervals) {
        throw new QuadratureError(
          `quadrature did not reach relative ${epsRel} on [${a}, ${b}] within ${this.maxIntervals} intervals (error ${Array.from(error).join(", ")})`,
        );
      }
      let worst = 0;
      let worstScore = -1;
      for (let i = 0; i < n; i++) {
        let score = 0;
        for (let c = 0; c < k; c++) {
          const tol = Math.max(epsAbs, epsRel * Math.abs(value[c]), UFLOW);
          const s = this.err[i * k + c] / tol;
          if (s > score) score = s;
        }
        if (score > worstScore) {
          worstScore = score;
          worst = i;
        }
      }
      if (n + 1 > this.lo.length) this.grow();
      const left = this.lo[worst];
      const right = this.hi[worst];
      const mid = 0.5 * (left + right);
      if (mid <= left || mid >= right) {
        throw new QuadratureError(`quadrature cannot subdivide [${left}, ${right}] further`);
      }
      this.rule(f, left, mid, this.res, this.err, worst * k);
      this.hi[worst] = mid;
      this.rule(f, mid, right, this.res, this.err, n * k);
      this.lo[n] = mid;
      this.hi[n] = right;
      n++;
    }
  }
}

const idle: GaussKronrodIntegrator[][] = [];

/**
 * An integrator of k components from a pool, to give back with releaseIntegrator when done: its scratch space is
 * made once, not on every call. Nested use (an integrand that integrates) takes another one, so it is reentrant.
 */
export function borrowIntegrator(components: number): GaussKronrodIntegrator {
  return idle[components]?.pop() ?? new GaussKronrodIntegrator(components);
}

export function releaseIntegrator(integrator: GaussKronrodIntegrator): void {
  idle[integrator.components] ??= [];
  idle[integrator.components].push(integrator);
}

/** Integrates a scalar function over [a, b] to max(epsAbs, epsRel |I|); returns the value and its error estimate. */
export function integrateScalar(
  f: (x: number) => number,
  a: number,
  b: number,
  epsRel = 1e-13,
  epsAbs = 0,
): { value: number; error: number } {
  const integrator = borrowIntegrator(1);
  const scalarValue = new Float64Array(1); // per call (small, on the heap), so nested calls cannot mix results
  const scalarError = new Float64Array(1);
  try {
    integrator.integrate(
      (x, out) => {
        out[0] = f(x);
      },
      a,
      b,
      epsRel,
      epsAbs,
      scalarValue,
      scalarError,
    );
    return { value: scalarValue[0], error: scalarError[0] };
  } finally {
    releaseIntegrator(integrator);
  }
}
