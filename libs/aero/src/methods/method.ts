/**
 * A method as the methods page shows it: formula (TeX, typeset by the web app), symbols with units,
 * validity range, published source and known limits in plain words. Each entry names the engine
 * module that implements it, whose doc comment carries the same formula.
 */
export interface MethodSymbol {
  /** TeX, e.g. `\theta`. */
  tex: string;
  meaning: string;
  /** Unit in words or SI, `–` when non-dimensional. */
  unit: string;
}

export interface MethodEntry {
  /** Stable id, used in addresses (`/methods/thwaites`) and by validation suites. */
  id: string;
  name: string;
  /** What the method gives the user, one sentence. */
  purpose: string;
  /** Engine module, relative to libs/aero/src. */
  module: string;
  /** Display formulas in TeX, one per line. */
  formulas: string[];
  symbols: MethodSymbol[];
  validity: string;
  /** Published sources: author, title, year (and "from memory" where the coefficients are quoted so). */
  sources: string[];
  /** Known limits in plain words. */
  limits: string[];
  /** Where its numbers appear in the notebook. */
  usedFor: string;
}
