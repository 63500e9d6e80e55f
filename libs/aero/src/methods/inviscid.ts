import type { MethodEntry } from './method';
import { METHOD_NAMES } from './method-names';

/** From a shape to its pressures: section definitions, panel methods and compressibility corrections. */
export const INVISCID_METHODS: MethodEntry[] = [
  {
    id: 'naca-sections',
    name: METHOD_NAMES['naca-sections'],
    purpose: 'Generates a section’s coordinates from its NACA designation.',
    module: 'naca-sections.ts',
    formulas: [
      '\\pm y_t = \\frac{t}{0.20}\\left(0.29690\\sqrt{x} - 0.12600\\,x - 0.35160\\,x^2 + 0.28430\\,x^3 - 0.10150\\,x^4\\right)',
      'y_c = \\frac{m}{p^2}\\left(2 p x - x^2\\right) \\;(x \\le p), \\qquad y_c = \\frac{m}{(1-p)^2}\\left(1 - 2p + 2 p x - x^2\\right) \\;(x > p)',
      'y_c = \\frac{k_1}{6}\\left(x^3 - 3 r x^2 + r^2 (3 - r)\\, x\\right) \\;(x < r), \\qquad y_c = \\frac{k_1 r^3}{6}(1 - x) \\;(x \\ge r)',
      'x_{U,L} = x \\mp y_t \\sin\\theta, \\qquad y_{U,L} = y_c \\pm y_t \\cos\\theta, \\qquad \\tan\\theta = \\frac{dy_c}{dx}',
    ],
    symbols: [
      { tex: 't', meaning: 'maximum thickness (last two digits / 100)', unit: 'chord' },
      { tex: 'm, p', meaning: 'four-digit camber and its position', unit: 'chord' },
      { tex: 'r, k_1', meaning: 'five-digit mean-line constants, tabulated per camber position', unit: '–' },
      { tex: 'y_t, y_c', meaning: 'thickness half-ordinate and mean line', unit: 'chord' },
    ],
    validity: 'Four-digit m p tt and five-digit L P 0 tt (no reflex) designations; thickness up to about 40 %.',
    sources: [
      'E. N. Jacobs, K. E. Ward and R. M. Pinkerton, NACA Report 460 (1933): thickness and four-digit mean line.',
      'E. N. Jacobs and R. M. Pinkerton, NACA Report 537 (1935); Jacobs, Pinkerton and Greenberg, NACA Report 610 (1937): five-digit mean line.',
      'I. H. Abbott and A. E. von Doenhoff, Theory of Wing Sections, 1959, §6.',
    ],
    limits: ['The trailing edge keeps the published finite thickness; the panel solution closes a gap under 2 % of chord and says so.'],
    usedFor: 'section cell: outline, thickness, camber and nose radius',
  },
  {
    id: 'vortex-panel',
    name: METHOD_NAMES['vortex-panel'],
    purpose: 'Inviscid incompressible pressure distribution, lift and moment of a section at an incidence or a target lift coefficient.',
    module: 'vortex-panel.ts',
    formulas: [
      '\\sum_{j=0}^{N} A_{ij}\\,\\gamma_j = -\\mathbf{V}_\\infty \\cdot \\mathbf{n}_i \\quad (i = 1 \\dots N), \\qquad \\gamma_0 + \\gamma_N = 0',
      'Q_t = \\gamma, \\qquad C_p = 1 - \\left(\\frac{Q_t}{V_\\infty}\\right)^2, \\qquad c_l = \\frac{2\\Gamma}{V_\\infty c}',
    ],
    symbols: [
      { tex: '\\gamma_j', meaning: 'vortex strength at node j, linear along each panel', unit: 'V∞' },
      { tex: 'A_{ij}', meaning: 'normal velocity at midpoint i induced by unit strength at node j', unit: '–' },
      { tex: '\\Gamma', meaning: 'circulation round the section', unit: 'V∞ c' },
      { tex: 'c_l', meaning: 'section lift coefficient', unit: '–' },
    ],
    validity: 'Attached, inviscid, two-dimensional flow; 100 to 300 panels resolve Cp to about 0.01 away from a cusped trailing edge.',
    sources: [
      'J. Katz and A. Plotkin, Low-Speed Aerodynamics, 2nd ed., 2001, §11.4.2 (linear-strength vortex method), eqs. 10.39–10.40 and 10.72.',
      'Checked against exact conformal-map solutions (Joukowski, Kármán–Trefftz) and the ellipse, and thin-aerofoil theory for lift slope and moment.',
    ],
    limits: [
      'No viscous displacement: lift and the suction peaks are those of the inviscid flow, a little above what a section gives at the same incidence.',
      'Separated flow (near and beyond maximum lift) is outside it.',
    ],
    usedFor: 'section and polar cells: Cp, lift, moment; an analysis that names a section cell',
  },
  {
    id: 'compressibility-correction',
    name: METHOD_NAMES['compressibility-correction'],
    purpose: 'Corrects an incompressible pressure coefficient to the free-stream Mach number and finds the critical Mach number.',
    module: 'compressibility-correction.ts',
    formulas: [
      '\\beta = \\sqrt{1 - M_\\infty^2}, \\qquad C_p^{PG} = \\frac{C_{p0}}{\\beta}',
      'C_p^{KT} = \\frac{C_{p0}}{\\beta + \\dfrac{M_\\infty^2}{1 + \\beta}\\,\\dfrac{C_{p0}}{2}}',
      'C_p^{*} = \\frac{2}{\\gamma M_\\infty^2}\\left[\\left(\\frac{2 + (\\gamma - 1) M_\\infty^2}{\\gamma + 1}\\right)^{\\gamma/(\\gamma-1)} - 1\\right]',
    ],
    symbols: [
      { tex: 'C_{p0}', meaning: 'incompressible pressure coefficient', unit: '–' },
      { tex: 'M_\\infty', meaning: 'free-stream Mach number', unit: '–' },
      { tex: 'C_p^{*}', meaning: 'pressure coefficient where the local flow is sonic', unit: '–' },
    ],
    validity: 'Subsonic attached flow about thin sections, local Mach below about 1 (Cp above Cp*).',
    sources: [
      'H. Glauert, Proc. R. Soc. A 118 (1928): Prandtl–Glauert rule.',
      'H. S. Tsien, J. Aeronaut. Sci. 6 (1939) p. 399; Th. von Kármán, J. Aeronaut. Sci. 8 (1941) p. 337: Kármán–Tsien rule.',
    ],
    limits: ['Both fail as the local flow nears sonic: where Cp passes Cp* the section is supercritical and the corrected Cp is only indicative.'],
    usedFor: 'section cell: Cp at the flow cell’s Mach number, critical Mach number',
  },
  {
    id: 'source-ring-panel',
    name: METHOD_NAMES['source-ring-panel'],
    purpose: 'Inviscid incompressible pressure distribution and radius along a body of revolution at zero incidence.',
    module: 'axisymmetric-panel.ts',
    formulas: [
      'u_x = \\frac{q R\\,(x - \\xi)\\, I_3}{4\\pi}, \\qquad u_r = \\frac{q R\\,(r I_3 - R I_c)}{4\\pi}',
      'I_1 = \\frac{4 K(m)}{P}, \\qquad I_3 = \\frac{4 E(m)}{\\rho^2 P}, \\qquad m = \\frac{2B}{P^2}',
      'C_p = 1 - \\left(\\frac{Q_t}{V_\\infty}\\right)^2',
    ],
    symbols: [
      { tex: 'q', meaning: 'source strength of a ring panel', unit: 'V∞' },
      { tex: 'R, \\xi', meaning: 'ring radius and axial station', unit: 'length' },
      { tex: 'K, E', meaning: 'complete elliptic integrals of the first and second kind', unit: '–' },
    ],
    validity: 'Closed bodies of revolution at zero incidence, attached incompressible flow.',
    sources: [
      'J. L. Hess and A. M. O. Smith, Progress in Aerospace Sciences 8 (1967), axisymmetric flow.',
      'Checked against the sphere (Cp = 1 − 9/4 sin²θ) and a 6:1 prolate spheroid (exact solutions).',
    ],
    limits: ['No incidence and no circulation: an open nacelle cowl with flow through it needs vortex rings and a Kutta condition, not built.'],
    usedFor: 'engine cases with a body (command line); Cp and radius for the Mangler march',
  },
];
