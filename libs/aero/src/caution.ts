/**
 * Shown wherever results are: what these numbers are and what decides instead. In a module of its own,
 * so a screen that shows results imports the sentence without the engine (`@laminote/aero/caution`).
 */
export const ENGINE_CAUTION =
  'Engineering estimates from integral boundary-layer methods and empirical transition criteria. ' +
  'Validated tools, test data and the governing design and certification practice decide.';
