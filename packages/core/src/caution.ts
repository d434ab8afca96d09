/**
 * The caution every result surface carries. Its own module, free of imports, so that the web
 * app can show the same words without bundling the solver.
 */
export const CAUTION =
  'Results are for review by a qualified geotechnical engineer. The user is responsible for the inputs; local codes and licensed practice govern the design.';
