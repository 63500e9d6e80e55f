import { Solver } from '../odex-solver';

/**
 * Falkner–Skan similarity solutions computed here, by shooting with odex, as an independent reference
 * for the laminar method. Equation (V. M. Falkner & S. W. Skan, Phil. Mag. 12, 1931; D. R. Hartree,
 * Proc. Camb. Phil. Soc. 33, 1937):
 *   f''' + f f'' + β (1 − f'²) = 0,  f(0) = f'(0) = 0,  f'(∞) = 1,
 * with η = y √((m + 1) Ue / (2 ν x)), Ue = C x^m, β = 2m/(m + 1). The wall curvature f''(0) is found by
 * bisection on the attached branch so that f' → 1 at the outer edge.
 */
export interface FalknerSkanSolution {
  beta: number;
  m: number;
  wallShear: number; // f''(0)
  displacement: number; // ∫ (1 − f') dη
  momentum: number; // ∫ f' (1 − f') dη
}

export function falknerSkan(beta: number, etaMax = 12): FalknerSkanSolution {
  const solver = new Solver(5);
  solver.relativeTolerance = 1e-11;
  solver.absoluteTolerance = 1e-11;
  solver.maxSteps = 100_000;
  const rhs = (_eta: number, y: number[]) => [y[1], y[2], -y[0] * y[2] - beta * (1 - y[1] * y[1]), 1 - y[1], y[1] * (1 - y[1])];
  // Outer velocity error for a trial f''(0); integration stops early once the profile runs away.
  const shoot = (w: number) => {
    let runaway = 0;
    const result = solver.solve(rhs, 0, [0, 0, w, 0, 0], etaMax, (_n, _x0, _x1, y) => {
      if (y[1] > 1.5) runaway = 1;
      else if (y[1] < -0.5) runaway = -1;
      return runaway === 0;
    });
    return { miss: runaway !== 0 ? runaway : result.y[1] - 1, y: result.y };
  };
  let lo = 0;
  let hi = 2;
  if (shoot(lo).miss > 0 || shoot(hi).miss < 0) throw new Error(`no bracket for beta ${beta}`);
  for (let it = 0; it < 80; it++) {
    const mid = 0.5 * (lo + hi);
    if (shoot(mid).miss < 0) lo = mid;
    else hi = mid;
  }
  const wallShear = 0.5 * (lo + hi);
  const { y } = shoot(wallShear);
  return { beta, m: beta / (2 - beta), wallShear, displacement: y[3], momentum: y[4] };
}
