/**
 * ODEX, E. Hairer & G. Wanner's extrapolation integrator for non-stiff ODEs (Gragg–Bulirsch–Stoer:
 * the explicit midpoint rule with Gragg's smoothing step, polynomial extrapolation in h², order and
 * step-size control, dense output of order 2κ − μ). Source: E. Hairer, S. P. Nørsett & G. Wanner,
 * "Solving Ordinary Differential Equations I", 2nd ed. (1993), §II.9 and the Fortran ODEX.F.
 *
 * This is the odex npm package (C. Smith's port of ODEX.F, 2.0.4) specialised to the way the engine
 * calls it, statement for statement and in the same floating-point order, so it takes the same steps
 * and returns the same numbers bit for bit (odex.spec.ts checks that against the package): step-size
 * sequence 4 (dense output), every component dense, the package's default controls. What differs is
 * only the plumbing the package's generic interface costs on every call: its 1-based JS arrays, a copy
 * of y for every derivative, and a new closure for the dense output of every step. Here the state is
 * in Float64Arrays made once per integrator, the derivative writes into an array it is given, and the
 * dense output of the last accepted step is a method. Head's turbulent march (head.ts) makes some 400
 * derivative evaluations per surface; through the package, that plumbing took about a third of the
 * march's time (issue 15).
 *
 * Arrays keep ODEX.F's 1-based indices (element 0 unused) so the code reads line by line against the
 * package; the derivative sees 0-based views.
 *
 * odex 2.0.4: Copyright (c) 2016 Colin Smith; ODEX.F: E. Hairer and G. Wanner. BSD 2-clause licence:
 * 1. Redistributions of source code must retain the above copyright notice, this list of conditions and
 * the following disclaimer. 2. Redistributions in binary form must reproduce the above copyright notice,
 * this list of conditions and the following disclaimer in the documentation and/or other materials
 * provided with the distribution. THIS SOFTWARE IS PROVIDED BY THE COPYRIGHT HOLDERS AND CONTRIBUTORS
 * "AS IS" AND ANY EXPRESS OR IMPLIED WARRANTIES, INCLUDING, BUT NOT LIMITED TO, THE IMPLIED WARRANTIES OF
 * MERCHANTABILITY AND FITNESS FOR A PARTICULAR PURPOSE ARE DISCLAIMED. IN NO EVENT SHALL THE COPYRIGHT
 * HOLDER OR CONTRIBUTORS BE LIABLE FOR ANY DIRECT, INDIRECT, INCIDENTAL, SPECIAL, EXEMPLARY, OR
 * CONSEQUENTIAL DAMAGES (INCLUDING, BUT NOT LIMITED TO, PROCUREMENT OF SUBSTITUTE GOODS OR SERVICES; LOSS
 * OF USE, DATA, OR PROFITS; OR BUSINESS INTERRUPTION) HOWEVER CAUSED AND ON ANY THEORY OF LIABILITY,
 * WHETHER IN CONTRACT, STRICT LIABILITY, OR TORT (INCLUDING NEGLIGENCE OR OTHERWISE) ARISING IN ANY WAY
 * OUT OF THE USE OF THIS SOFTWARE, EVEN IF ADVISED OF THE POSSIBILITY OF SUCH DAMAGE.
 */

/** dy/dx at (x, y), written into `dy` (both 0-based, length n). */
export type DerivativeInto = (x: number, y: Float64Array, dy: Float64Array) => void;

/**
 * Called after every accepted step from xOld to x with y at x (0-based; valid during the call only).
 * `Odex.dense(component, at)` interpolates inside the step. Return false to stop.
 */
export type StepObserver = (xOld: number, x: number, y: Float64Array) => boolean;

/** How an integration ended: at xEnd, at the step limit, or stopped by the observer. */
export type OdexOutcome = 'converged' | 'maxStepsExceeded' | 'stopped';

export interface OdexOptions {
  /** Scalar relative tolerance (the package's `relativeTolerance`). */
  relativeTolerance: number;
  /** Absolute tolerance per component (the package's `absoluteTolerance` as an array). */
  absoluteTolerance: ArrayLike<number>;
  initialStepSize: number;
  /** 0: no limit beyond the interval (the package's default). */
  maxStepSize?: number;
  maxSteps?: number;
}

export interface OdexStatistics {
  outcome: OdexOutcome;
  nStep: number;
  nAccept: number;
  nReject: number;
  nEval: number;
}

// The package's defaults, which the engine keeps.
const KM = 9; // maxExtrapolationColumns
const N_SEQ = 4; // stepSizeSequence with dense output
const U_ROUND = 2.3e-16;
const STABILITY_CHECK_COUNT = 1;
const STABILITY_CHECK_TABLE_LINES = 2;
const INTERPOLATION_FORMULA_DEGREE = 4;
const STEP_SIZE_REDUCTION_FACTOR = 0.5;
const STEP_SIZE_FAC1 = 0.02;
const STEP_SIZE_FAC2 = 4.0;
const STEP_SIZE_FAC3 = 0.8;
const STEP_SIZE_FAC4 = 0.9;
const STEP_SAFETY_FACTOR1 = 0.65;
const STEP_SAFETY_FACTOR2 = 0.94;
const LF_SAFE = 2 * KM * KM + KM;

// Tables that depend on the step-size sequence and the controls only, each computed as the package
// computes it inline.
const NJ = new Float64Array(KM + 1); // 1-based step-number sequence 4i − 2
const A = new Float64Array(KM + 1); // work per column, for the order selection
const I_POINT = new Int32Array(KM + 2);
const ERR_FAC = new Float64Array(2 * KM + 1);
/** EXTRAPOLATION_FACTOR[j * (KM + 1) + l] = (nj[j] / nj[l − 1])² − 1. */
const EXTRAPOLATION_FACTOR = new Float64Array((KM + 1) * (KM + 1));
/** STEP_FAC_MIN[j] = fac1^(1 / (2j − 1)), the smallest step-size factor after line j. */
const STEP_FAC_MIN = new Float64Array(KM + 1);
/** DERIVATIVE_SCALE[kk * (2 * KM + 2) + kmi] = (nj[kk] / 2)^(kmi − 1). */
const DERIVATIVE_SCALE = new Float64Array((KM + 1) * (2 * KM + 2));
{
  for (let i = 1; i <= KM; ++i) NJ[i] = 4 * i - 2;
  A[1] = 1 + NJ[1];
  for (let i = 2; i <= KM; ++i) A[i] = A[i - 1] + NJ[i];
  I_POINT[1] = 0;
  for (let i = 1; i <= KM; ++i) {
    let njAdd = 4 * i - 2;
    if (NJ[i] > njAdd) ++njAdd;
    I_POINT[i + 1] = I_POINT[i] + njAdd;
  }
  for (let mu = 1; mu <= 2 * KM; ++mu) {
    const errx = Math.sqrt(mu / (mu + 4)) * 0.5;
    let prod = Math.pow(1 / (mu + 4), 2);
    for (let j = 1; j <= mu; ++j) prod *= errx / j;
    ERR_FAC[mu] = prod;
  }
  for (let j = 2; j <= KM; ++j) {
    for (let l = j; l >= 2; --l) EXTRAPOLATION_FACTOR[j * (KM + 1) + l] = Math.pow(NJ[j] / NJ[l - 1], 2) - 1;
  }
  for (let j = 1; j <= KM; ++j) STEP_FAC_MIN[j] = Math.pow(STEP_SIZE_FAC1, 1 / (2 * j - 1));
  for (let kk = 1; kk <= KM; ++kk) {
    for (let kmi = 1; kmi <= 2 * KM + 1; ++kmi) DERIVATIVE_SCALE[kk * (2 * KM + 2) + kmi] = Math.pow(NJ[kk] / 2, kmi - 1);
  }
}

const noDerivative: DerivativeInto = () => {};

/** x², where the package writes Math.pow(x, 2): V8 gives the same double (odex.spec.ts checks the steps). */
function square(x: number): number {
  return x * x;
}

const enum State {
  Start,
  BasicIntegrationStep,
  ConvergenceStep,
  HopeForConvergence,
  Accept,
  Reject,
}

/** One integrator for systems of `n` equations; reuse it for many integrations (not re-entrant). */
export class Odex {
  private readonly n: number;
  // 1-based state, as in the package.
  private readonly y: Float64Array;
  private readonly dz: Float64Array;
  private readonly yh1: Float64Array;
  private readonly yh2: Float64Array;
  private readonly dy: Float64Array;
  private readonly scal: Float64Array;
  private readonly aTol: Float64Array;
  /** Extrapolation table t[j][i] at j * (n + 1) + i. */
  private readonly t: Float64Array;
  /** ySafe[j][i] at j * (n + 1) + i. */
  private readonly ySafe: Float64Array;
  /** fSafe[l][i] at l * (n + 1) + i. */
  private readonly fSafe: Float64Array;
  private readonly dens: Float64Array;
  private readonly hh = new Float64Array(KM + 1);
  private readonly w = new Float64Array(KM + 1);
  private readonly interpolation = new Float64Array(31);
  // 0-based views handed to the derivative and the observer.
  private readonly yView: Float64Array;
  private readonly dzView: Float64Array;
  private readonly yh1View: Float64Array;
  private readonly yh2View: Float64Array;
  private readonly dyView: Float64Array;

  // The integration's scalars (ODEX.F's locals and /CONODX/).
  private f: DerivativeInto = noDerivative;
  private x = 0;
  private xOld = 0;
  private h = 0;
  private hMax = 0;
  private posneg = 1;
  private rTol = 0;
  private k = 0;
  private kc = 0;
  private err = 0;
  private errOld = 0;
  private hoptde = 0;
  private reject = false;
  private atov = false;
  private iPt = 0;
  private nEval = 0;
  private nStep = 0;
  private nAccept = 0;
  private nReject = 0;
  private xOldd = 0;
  private hhh = 0;
  private kmit = 0;

  constructor(n: number) {
    this.n = n;
    const m = n + 1;
    this.y = new Float64Array(m);
    this.dz = new Float64Array(m);
    this.yh1 = new Float64Array(m);
    this.yh2 = new Float64Array(m);
    this.dy = new Float64Array(m);
    this.scal = new Float64Array(m);
    this.aTol = new Float64Array(m);
    this.t = new Float64Array((KM + 1) * m);
    this.ySafe = new Float64Array((KM + 1) * m);
    this.fSafe = new Float64Array((LF_SAFE + 1) * m);
    this.dens = new Float64Array((2 * KM + 5) * n + 1);
    this.yView = this.y.subarray(1);
    this.dzView = this.dz.subarray(1);
    this.yh1View = this.yh1.subarray(1);
    this.yh2View = this.yh2.subarray(1);
    this.dyView = this.dy.subarray(1);
  }

  /**
   * Integrate from x to xEnd (xEnd > x) starting at y0, calling `observe` after every accepted step.
   * Unlike the package, the observer is not called for the initial point.
   */
  solve(f: DerivativeInto, x: number, y0: ArrayLike<number>, xEnd: number, options: OdexOptions, observe: StepObserver): OdexStatistics {
    const n = this.n;
    const { y, scal, aTol, w, hh } = this;
    for (let i = 1; i <= n; ++i) {
      y[i] = y0[i - 1];
      aTol[i] = options.absoluteTolerance[i - 1];
    }
    this.f = f;
    this.rTol = options.relativeTolerance;
    const maxSteps = options.maxSteps ?? 10000;
    this.hMax = Math.abs(options.maxStepSize || xEnd - x);
    this.nEval = 0;
    this.nStep = 0;
    this.nAccept = 0;
    this.nReject = 0;
    this.x = x;
    const rTol = this.rTol;
    // Initial scaling
    for (let i = 1; i <= n; ++i) scal[i] = aTol[i] + rTol + Math.abs(y[i]);
    // Initial preparations
    const posneg = xEnd - x >= 0 ? 1 : -1;
    this.posneg = posneg;
    this.k = Math.max(2, Math.min(KM - 1, Math.floor(-(Math.log(rTol + 1e-40) / Math.LN10) * 0.6 + 1.5)));
    const h = Math.max(Math.abs(options.initialStepSize), 1e-4);
    this.h = posneg * Math.min(h, this.hMax, Math.abs(xEnd - x) / 2);
    this.xOld = x;
    this.iPt = 0;
    this.err = 0;
    this.errOld = 1e10;
    this.hoptde = posneg * this.hMax;
    // Unset entries read as the package's undefined would: no comparison holds, arithmetic gives NaN.
    w.fill(NaN);
    w[1] = 0;
    hh.fill(NaN);
    this.reject = false;
    let last = false;
    this.atov = false;
    this.kc = 0;
    let state = State.Start;
    let outcome: OdexOutcome = 'converged';
    loop: while (true) {
      switch (state) {
        case State.Start: {
          this.atov = false;
          // Is xEnd reached in the next step?
          if (0.1 * Math.abs(xEnd - this.x) <= Math.abs(this.x) * U_ROUND) break loop;
          this.h = posneg * Math.min(Math.abs(this.h), Math.abs(xEnd - this.x), this.hMax, Math.abs(this.hoptde));
          if ((this.x + 1.01 * this.h - xEnd) * posneg > 0) {
            this.h = xEnd - this.x;
            last = true;
          }
          if (this.nStep === 0) {
            f(this.x, this.yView, this.dzView);
            ++this.nEval;
          }
          // The first and last step
          if (this.nStep === 0 || last) {
            this.iPt = 0;
            ++this.nStep;
            for (let j = 1; j <= this.k; ++j) {
              this.kc = j;
              this.midex(j);
              if (this.atov) continue loop;
              if (j > 1 && this.err <= 1) {
                state = State.Accept;
                continue loop;
              }
            }
            state = State.HopeForConvergence;
            continue;
          }
          state = State.BasicIntegrationStep;
          continue;
        }
        case State.BasicIntegrationStep: {
          // basic integration step
          this.iPt = 0;
          ++this.nStep;
          if (this.nStep >= maxSteps) {
            outcome = 'maxStepsExceeded';
            break loop;
          }
          this.kc = this.k - 1;
          for (let j = 1; j <= this.kc; ++j) {
            this.midex(j);
            if (this.atov) {
              state = State.Start;
              continue loop;
            }
          }
          // convergence monitor
          const k = this.k;
          if (k === 2 || this.reject) {
            state = State.ConvergenceStep;
          } else if (this.err <= 1) {
            state = State.Accept;
          } else if (this.err > Math.pow((NJ[k + 1] * NJ[k]) / 4, 2)) {
            state = State.Reject;
          } else state = State.ConvergenceStep;
          continue;
        }
        case State.ConvergenceStep:
          this.midex(this.k);
          if (this.atov) {
            state = State.Start;
            continue;
          }
          this.kc = this.k;
          if (this.err <= 1) {
            state = State.Accept;
            continue;
          }
          state = State.HopeForConvergence;
          continue;
        case State.HopeForConvergence:
          // hope for convergence in line k + 1
          if (this.err > Math.pow(NJ[this.k + 1] / 2, 2)) {
            state = State.Reject;
            continue;
          }
          this.kc = this.k + 1;
          this.midex(this.kc);
          if (this.atov) state = State.Start;
          else if (this.err > 1) state = State.Reject;
          else state = State.Accept;
          continue;
        case State.Accept:
          if (!this.acceptStep(observe)) {
            outcome = 'stopped';
            break loop;
          }
          state = State.Start;
          continue;
        case State.Reject: {
          let k = Math.min(this.k, this.kc, KM - 1);
          if (k > 2 && w[k - 1] < w[k] * STEP_SIZE_FAC3) k -= 1;
          this.k = k;
          ++this.nReject;
          this.h = posneg * hh[k];
          this.reject = true;
          state = State.BasicIntegrationStep;
        }
      }
    }
    this.f = noDerivative;
    return { outcome, nStep: this.nStep, nAccept: this.nAccept, nReject: this.nReject, nEval: this.nEval };
  }

  /** Component `component` (0-based) of the dense output of the last accepted step, at `at`. */
  dense(component: number, at: number): number {
    const nrd = this.n;
    const y = this.dens;
    const i = component + 1;
    const imit = this.kmit;
    const theta = (at - this.xOldd) / this.hhh;
    const theta1 = 1 - theta;
    const phthet = y[i] + theta * (y[nrd + i] + theta1 * (y[2 * nrd + i] * theta + y[3 * nrd + i] * theta1));
    if (imit < 0) return phthet;
    const thetah = theta - 0.5;
    let ret = y[nrd * (imit + 4) + i];
    for (let im = imit; im >= 1; --im) ret = y[nrd * (im + 3) + i] + (ret * thetah) / im;
    const tt = theta * theta1;
    return phthet + tt * tt * ret;
  }

  /** Computes the jth line of the extrapolation table and provides an estimation of the optimal step size. */
  private midex(j: number): void {
    const n = this.n;
    const m1 = n + 1;
    const { y, dz, yh1, yh2, dy, t, ySafe, fSafe, scal, hh, w } = this;
    const f = this.f;
    const x = this.x;
    const h = this.h;
    const nrd = n;
    const njj = NJ[j];
    const hj = h / njj;
    // Euler starting step
    for (let i = 1; i <= n; ++i) {
      yh1[i] = y[i];
      yh2[i] = y[i] + hj * dz[i];
    }
    // Explicit midpoint rule
    const m = njj - 1;
    const njMid = (njj / 2) | 0;
    for (let mm = 1; mm <= m; ++mm) {
      if (mm === njMid) {
        for (let i = 1; i <= nrd; ++i) ySafe[j * m1 + i] = yh2[i];
      }
      f(x + hj * mm, this.yh2View, this.dyView);
      if (Math.abs(mm - njMid) <= 2 * j - 1) {
        ++this.iPt;
        const row = this.iPt * m1;
        for (let i = 1; i <= nrd; ++i) fSafe[row + i] = dy[i];
      }
      for (let i = 1; i <= n; ++i) {
        const ys = yh1[i];
        yh1[i] = yh2[i];
        yh2[i] = ys + 2 * hj * dy[i];
      }
      if (mm <= STABILITY_CHECK_COUNT && j <= STABILITY_CHECK_TABLE_LINES) {
        // stability check
        let del1 = 0;
        for (let i = 1; i <= n; ++i) del1 += square(dz[i] / scal[i]);
        let del2 = 0;
        for (let i = 1; i <= n; ++i) del2 += square((dy[i] - dz[i]) / scal[i]);
        const quot = del2 / Math.max(U_ROUND, del1);
        if (quot > 4) {
          ++this.nEval;
          this.atov = true;
          this.h *= STEP_SIZE_REDUCTION_FACTOR;
          this.reject = true;
          return;
        }
      }
    }
    // final smoothing step
    f(x + h, this.yh2View, this.dyView);
    if (njMid <= 2 * j - 1) {
      ++this.iPt;
      const row = this.iPt * m1;
      for (let i = 1; i <= nrd; ++i) fSafe[row + i] = dy[i];
    }
    for (let i = 1; i <= n; ++i) t[j * m1 + i] = (yh1[i] + yh2[i] + hj * dy[i]) / 2;
    this.nEval += njj;
    // polynomial extrapolation
    if (j === 1) return;
    let fac: number;
    for (let l = j; l > 1; --l) {
      fac = EXTRAPOLATION_FACTOR[j * (KM + 1) + l];
      for (let i = 1; i <= n; ++i) t[(l - 1) * m1 + i] = t[l * m1 + i] + (t[l * m1 + i] - t[(l - 1) * m1 + i]) / fac;
    }
    let err = 0;
    // scaling
    for (let i = 1; i <= n; ++i) {
      const t1i = Math.max(Math.abs(y[i]), Math.abs(t[m1 + i]));
      scal[i] = this.aTol[i] + this.rTol * t1i;
      err += square((t[m1 + i] - t[2 * m1 + i]) / scal[i]);
    }
    err = Math.sqrt(err / n);
    this.err = err;
    if (err * U_ROUND >= 1 || (j > 2 && err >= this.errOld)) {
      this.atov = true;
      this.h *= STEP_SIZE_REDUCTION_FACTOR;
      this.reject = true;
      return;
    }
    this.errOld = Math.max(4 * err, 1);
    // compute optimal step sizes
    const exp0 = 1 / (2 * j - 1);
    const facMin = STEP_FAC_MIN[j];
    fac = Math.min(STEP_SIZE_FAC2 / facMin, Math.max(facMin, Math.pow(err / STEP_SAFETY_FACTOR1, exp0) / STEP_SAFETY_FACTOR2));
    fac = 1 / fac;
    hh[j] = Math.min(Math.abs(h) * fac, this.hMax);
    w[j] = A[j] / hh[j];
  }

  /**
   * Returns true if the integration goes on; false only when the observer asked to stop. Builds the
   * dense output of the step, estimates its interpolation error, and chooses the next order and step.
   */
  private acceptStep(observe: StepObserver): boolean {
    const n = this.n;
    const m1 = n + 1;
    const nrd = n;
    const { y, dz, yh1, yh2, t, ySafe, fSafe, dens, scal, hh, w } = this;
    this.xOld = this.x;
    this.x += this.h;
    const h = this.h;
    const kc = this.kc;
    // kmit = mu of the paper
    const kmit = 2 * kc - INTERPOLATION_FORMULA_DEGREE + 1;
    this.kmit = kmit;
    for (let i = 1; i <= nrd; ++i) dens[i] = y[i];
    this.xOldd = this.xOld;
    this.hhh = h;
    for (let i = 1; i <= nrd; ++i) dens[nrd + i] = h * dz[i];
    const kln = 2 * nrd;
    for (let i = 1; i <= nrd; ++i) dens[kln + i] = t[m1 + i];
    // compute solution at mid-point
    for (let j = 2; j <= kc; ++j) {
      for (let l = j; l >= 2; --l) {
        const factor = EXTRAPOLATION_FACTOR[j * (KM + 1) + l];
        for (let i = 1; i <= nrd; ++i) ySafe[(l - 1) * m1 + i] = ySafe[l * m1 + i] + (ySafe[l * m1 + i] - ySafe[(l - 1) * m1 + i]) / factor;
      }
    }
    let krn = 4 * nrd;
    for (let i = 1; i <= nrd; ++i) dens[krn + i] = ySafe[m1 + i];
    // compute first derivative at right end
    for (let i = 1; i <= n; ++i) yh1[i] = t[m1 + i];
    this.f(this.x, this.yh1View, this.yh2View);
    krn = 3 * nrd;
    for (let i = 1; i <= nrd; ++i) dens[krn + i] = yh2[i] * h;
    // THE LOOP
    for (let kmi = 1; kmi <= kmit; ++kmi) {
      // compute kmi-th derivative at mid-point
      const kbeg = ((kmi + 1) / 2) | 0;
      for (let kk = kbeg; kk <= kc; ++kk) {
        const facnj = DERIVATIVE_SCALE[kk * (2 * KM + 2) + kmi];
        const iPt = I_POINT[kk + 1] - 2 * kk + kmi;
        this.iPt = iPt;
        for (let i = 1; i <= nrd; ++i) ySafe[kk * m1 + i] = fSafe[iPt * m1 + i] * facnj;
      }
      for (let j = kbeg + 1; j <= kc; ++j) {
        for (let l = j; l >= kbeg + 1; --l) {
          const factor = EXTRAPOLATION_FACTOR[j * (KM + 1) + l];
          for (let i = 1; i <= nrd; ++i) ySafe[(l - 1) * m1 + i] = ySafe[l * m1 + i] + (ySafe[l * m1 + i] - ySafe[(l - 1) * m1 + i]) / factor;
        }
      }
      krn = (kmi + 4) * nrd;
      for (let i = 1; i <= nrd; ++i) dens[krn + i] = ySafe[kbeg * m1 + i] * h;
      if (kmi === kmit) continue;
      // compute differences
      for (let kk = ((kmi + 2) / 2) | 0; kk <= kc; ++kk) {
        const lbeg = I_POINT[kk + 1];
        let lend = I_POINT[kk] + kmi + 1;
        if (kmi === 1 && N_SEQ === 4) lend += 2;
        let l: number;
        for (l = lbeg; l >= lend; l -= 2) {
          for (let i = 1; i <= nrd; ++i) fSafe[l * m1 + i] -= fSafe[(l - 2) * m1 + i];
        }
        if (kmi === 1 && N_SEQ === 4) {
          l = lend - 2;
          for (let i = 1; i <= nrd; ++i) fSafe[l * m1 + i] -= dz[i];
        }
      }
      // compute differences
      for (let kk = ((kmi + 2) / 2) | 0; kk <= kc; ++kk) {
        const lbeg = I_POINT[kk + 1] - 1;
        const lend = I_POINT[kk] + kmi + 2;
        for (let l = lbeg; l >= lend; l -= 2) {
          for (let i = 1; i <= nrd; ++i) fSafe[l * m1 + i] -= fSafe[(l - 2) * m1 + i];
        }
      }
    }
    this.interp(nrd, kmit);
    // estimation of interpolation error
    if (kmit >= 1) {
      let errint = 0;
      for (let i = 1; i <= nrd; ++i) errint += square(dens[(kmit + 4) * nrd + i] / scal[i]);
      errint = Math.sqrt(errint / nrd) * ERR_FAC[kmit];
      this.hoptde = h / Math.max(Math.pow(errint, 1 / (kmit + 4)), 0.01);
      if (errint > 10) {
        this.h = this.hoptde;
        this.x = this.xOld;
        ++this.nReject;
        this.reject = true;
        return true;
      }
    }
    for (let i = 1; i <= n; ++i) dz[i] = yh2[i];
    for (let i = 1; i <= n; ++i) y[i] = t[m1 + i];
    ++this.nAccept;
    if (observe(this.xOld, this.x, this.yView) === false) return false;
    // compute optimal order
    let kopt: number;
    const k = this.k;
    if (kc === 2) {
      kopt = Math.min(3, KM - 1);
      if (this.reject) kopt = 2;
    } else if (kc <= k) {
      kopt = kc;
      if (w[kc - 1] < w[kc] * STEP_SIZE_FAC3) kopt = kc - 1;
      if (w[kc] < w[kc - 1] * STEP_SIZE_FAC4) kopt = Math.min(kc + 1, KM - 1);
    } else {
      kopt = kc - 1;
      if (kc > 3 && w[kc - 2] < w[kc - 1] * STEP_SIZE_FAC3) kopt = kc - 2;
      if (w[kc] < w[kopt] * STEP_SIZE_FAC4) kopt = Math.min(kc, KM - 1);
    }
    // after a rejected step
    if (this.reject) {
      this.k = Math.min(kopt, kc);
      this.h = this.posneg * Math.min(Math.abs(h), Math.abs(hh[this.k]));
      this.reject = false;
      return true;
    }
    let hNew: number;
    if (kopt <= kc) {
      hNew = hh[kopt];
    } else if (kc < k && w[kc] < w[kc - 1] * STEP_SIZE_FAC4) {
      hNew = (hh[kc] * A[kopt + 1]) / A[kc];
    } else {
      hNew = (hh[kc] * A[kopt]) / A[kc];
    }
    // compute step size for the next step
    this.k = kopt;
    this.h = this.posneg * Math.abs(hNew);
    return true;
  }

  /** Computes the coefficients of the interpolation formula (in place in `dens`). */
  private interp(n: number, imit: number): void {
    const y = this.dens;
    const a = this.interpolation;
    // begin with Hermite interpolation
    for (let i = 1; i <= n; ++i) {
      const y0 = y[i];
      const y1 = y[2 * n + i];
      const yp0 = y[n + i];
      const yp1 = y[3 * n + i];
      const yDiff = y1 - y0;
      const aspl = -yp1 + yDiff;
      const bspl = yp0 - yDiff;
      y[n + i] = yDiff;
      y[2 * n + i] = aspl;
      y[3 * n + i] = bspl;
      if (imit < 0) continue;
      // compute the derivatives of Hermite at midpoint
      const ph0 = (y0 + y1) * 0.5 + 0.125 * (aspl + bspl);
      const ph1 = yDiff + (aspl - bspl) * 0.25;
      const ph2 = -(yp0 - yp1);
      const ph3 = 6 * (bspl - aspl);
      // compute the further coefficients
      if (imit >= 1) {
        a[1] = 16 * (y[5 * n + i] - ph1);
        if (imit >= 3) {
          a[3] = 16 * (y[7 * n + i] - ph3 + 3 * a[1]);
          if (imit >= 5) {
            for (let im = 5; im <= imit; im += 2) {
              const fac1 = (im * (im - 1)) / 2;
              const fac2 = fac1 * (im - 2) * (im - 3) * 2;
              a[im] = 16 * (y[(im + 4) * n + i] + fac1 * a[im - 2] - fac2 * a[im - 4]);
            }
          }
        }
      }
      a[0] = (y[4 * n + i] - ph0) * 16;
      if (imit >= 2) {
        a[2] = (y[n * 6 + i] - ph2 + a[0]) * 16;
        if (imit >= 4) {
          for (let im = 4; im <= imit; im += 2) {
            const fac1 = (im * (im - 1)) / 2;
            const fac2 = im * (im - 1) * (im - 2) * (im - 3);
            a[im] = (y[n * (im + 4) + i] + a[im - 2] * fac1 - a[im - 4] * fac2) * 16;
          }
        }
      }
      for (let im = 0; im <= imit; ++im) y[n * (im + 4) + i] = a[im];
    }
  }
}
