/**
 * The warning codes the solver and the input checks raise (packages/core/src), explained for
 * the engineer reading a result: what it means and what to check. A code not listed here is
 * shown with the solver's own message.
 */
export interface WarningExplanation {
  /** A short plain title. */
  title: string;
  /** What the warning means. */
  meaning: string;
  /** What to check or do about it. */
  check: string;
}

export const WARNING_EXPLANATIONS: Readonly<Record<string, WarningExplanation>> = {
  // ---- the result: the search and the methods
  'no-surface': {
    title: 'No slip surface found',
    meaning:
      'The search tried its trial surfaces but none of them was admissible (each missed the ground, left the section or entered a rigid base), so there is no factor of safety.',
    check:
      'Check the search grid, the radii or tangent elevations and the ground ranges against the geometry; widen them or give a surface.',
  },
  'no-significant-slope': {
    title: 'No significant slope',
    meaning:
      'The ground hardly rises across the section, or the least factor of safety of the search is so large that no slip surface matters, so no factor of safety is reported as the verdict.',
    check:
      'If a slope was expected here, check the ground profile (its elevations and units) and the search; otherwise nothing needs checking for stability at this station.',
  },
  'minimum-on-edge': {
    title: 'Lowest FS on the edge of the search grid',
    meaning:
      'After every allowed move the lowest factor of safety still lies on the edge of the grid of centres, so a lower value may exist outside the grid.',
    check: 'Widen the grid of centres or allow more moves, and run again.',
  },
  'surface-rejected': {
    title: 'The given slip surface was rejected',
    meaning:
      'The surface given in the input could not be cut into slices: it misses the ground, leaves the section, comes out and back in, or enters a rigid base.',
    check: "Check the surface's points (or centre and radius) against the ground and the strata.",
  },
  'cohesionless-circle': {
    title: 'No cohesion: a shallow slide governs',
    meaning:
      'With c′ = 0 the critical circle flattens toward a shallow slide parallel to the steepest ground; the infinite-slope factor of safety of that ground is the limit and governs.',
    check:
      'Check that zero cohesion is intended; compare the result with the infinite-slope value given in the message.',
  },
  'no-convergence': {
    title: 'A method found no solution',
    meaning:
      'The iteration of this method did not reach a factor of safety on this surface; it gives no FS, and the governing value comes from the other methods.',
    check:
      'Read the reason given; check the surface near its ends (steep toe, crack), the pore pressures and the strengths, and compare with the other methods.',
  },
  'not-applicable': {
    title: 'Method does not apply here',
    meaning:
      'This method cannot be used on this section or surface (for example a circle-only method on a noncircular surface, or an infinite slope without its settings), so it was not run.',
    check: 'Choose methods that suit the surface, or give the settings the method needs.',
  },
  'm-alpha-small': {
    title: 'mα below 0.2 in some slices',
    meaning:
      'In some slices (the message says how many) mα = cos α + sin α·tan φ′/F is small, which makes the base normal force of Bishop-type methods unreliable (Whitman & Bailey 1967); typically the surface is too steep where it comes out at the toe.',
    check:
      'Look at the toe of the surface in the drawing; compare with a rigorous method, or constrain the search so that the exit is less steep.',
  },
  'negative-normal': {
    title: 'Tension at the base of some slices',
    meaning:
      'The effective normal force on the base comes out negative in some slices whose strength depends on it (φ′ > 0; the message says how many, the slice table marks them): the soil there would have to carry tension, which it cannot. Undrained (φ = 0) bases are not counted: their strength does not depend on it.',
    check:
      'Check the pore pressures, the tension crack (a crack often removes this) and the ends of the surface.',
  },
  'thrust-outside': {
    title: 'Line of thrust outside the slices',
    meaning:
      'Between some slices the interslice force acts above the ground or below the base, so the interslice forces found are not physically acceptable there.',
    check:
      'Look at the steep parts of the surface and its upper end; a tension crack or another interslice function may help. Treat this FS with care.',
  },
  'probability-not-computed': {
    title: 'No probability of failure',
    meaning:
      'The section asks for its probability of failure, but it could not be computed: a random variable names an input that a design case does not have, or the realisations reached the time limit of a section. The factor of safety and the verdict stand.',
    check:
      'Read the reason given; correct the variable, or ask for fewer realisations (or make a study of the section, which has a longer time limit).',
  },
  'reinforcement-not-crossed': {
    title: 'A reinforcing element is not crossed',
    meaning:
      'The critical slip surface of this method does not cross the element (the message names it), so it adds nothing to this factor of safety: the slide passes above, below or beside it.',
    check:
      'Check that the element is where it was meant to be (its elevation, head, length and side) and whether a longer or lower element should reach the surfaces that govern.',
  },
  'reinforcement-fully-mobilised': {
    title: 'A reinforcing element is used to its full capacity',
    meaning:
      'Where the critical surface crosses the element the equilibrium takes the whole of the least of its capacities (F ≤ 1 with a force divided by F, or a force at its full value): there is no margin on it, and any lower capacity lowers this factor of safety.',
    check:
      'Read what limits it in the reinforcement table (its strength, its pullout behind or in front, its facing) and check that value and its reduction factors.',
  },
  'reinforcement-ignored': {
    title: 'A reinforcing element is left out',
    meaning:
      'This method does not take the reinforcement (the infinite slope: there is no slip surface to cross it), so its factor of safety is that of the slope without it; the methods of slices take it.',
    check: 'Compare with the methods of slices, which include the reinforcement.',
  },

  // ---- the input: checks that warn but do not stop the analysis
  'unit-weight-unusual': {
    title: 'Unusual unit weight',
    meaning:
      'A unit weight lies outside the usual range for soil, rock or water, which often means a value in the wrong units.',
    check: "Check the value and the file's unit system (si: kN/m³, us: pcf).",
  },
  'saturated-below-bulk': {
    title: 'Saturated unit weight below the bulk one',
    meaning:
      'The saturated unit weight given is smaller than the unit weight above the water, which is normally the other way round.',
    check: 'Check the two unit weights of the material.',
  },
  'no-strength': {
    title: 'A material has no strength',
    meaning: 'The material has c′ = 0 and φ′ = 0 (or Su = 0 with no increase with depth).',
    check: 'Check the strength parameters; zero strength is rarely intended.',
  },
  'rigid-on-top': {
    title: 'The top stratum is rigid',
    meaning: 'The stratum at the ground is a rigid base, so no slip surface can enter the ground.',
    check: 'Check the order of the strata and their materials.',
  },
  'below-rigid': {
    title: 'A stratum lies below a rigid base',
    meaning: 'No slip surface can reach this stratum, because a rigid base lies above it.',
    check: 'Check the order of the strata; the stratum below does not take part.',
  },
  'first-top-ignored': {
    title: "The first stratum's top is ignored",
    meaning:
      'The top of the first stratum is always the ground; the top given for it was not used.',
    check: 'Remove the top of the first stratum, or check that the strata are in order.',
  },
  'material-unused': {
    title: 'A material is not used',
    meaning: 'The material is defined but no stratum refers to it.',
    check: "Check the strata's material names for a misspelling.",
  },
  'boundary-above-ground': {
    title: 'A stratum boundary rises above the ground',
    meaning: 'Part of a stratum top lies above the ground surface; it was clipped to the ground.',
    check: 'Check the boundary points where it was clipped.',
  },
  'boundary-crosses': {
    title: 'A stratum boundary crosses the one above',
    meaning:
      'Part of a stratum top rises above the top of the stratum above it; it was clipped to that stratum.',
    check: 'Check the order of the strata and the boundary points.',
  },
  'stratum-vanishes': {
    title: 'A stratum has no thickness',
    meaning:
      'After clipping, a stratum has no thickness anywhere: the stratum below reaches its top everywhere.',
    check: 'Check the boundaries of the two strata.',
  },
  'offset-outside': {
    title: 'Alignment offset off the ground',
    meaning: "The alignment's x lies outside the ground's x-range.",
    check: 'Check the offset against the ground points.',
  },
  'infinite-slope-unused': {
    title: 'Infinite-slope settings not used',
    meaning: 'Infinite-slope settings are given, but the infinite slope is not among the methods.',
    check: 'Add the infinite slope to the methods, or remove its settings.',
  },
  'circular-method': {
    title: 'Circle method on a noncircular surface',
    meaning:
      'A method that takes moments about the centre of a circle was asked for on a polyline surface.',
    check: "Use Spencer's, Morgenstern–Price or Janbu's method for a polyline surface.",
  },
  'required-fs-below-one': {
    title: 'Required FS below 1',
    meaning: 'A required factor of safety below 1 would accept a slope that is not stable.',
    check: 'Check the required FS of the design case.',
  },
  'no-template': {
    title: 'A corridor without shared settings',
    meaning:
      "The GeoJSON corridor came with no shared settings (its id, units and template), neither as a member of the FeatureCollection nor as a separate file: the batch id comes from the file name, the units are taken as si (m, kN), and every feature has to carry all of its section's settings itself.",
    check:
      "Check that the units are the corridor's and that each section has its materials, strata and analysis; give the corridor its shared settings to be sure.",
  },
  'looks-like-degrees': {
    title: 'Coordinates look like longitude and latitude',
    meaning:
      'The section line is a tiny fraction of a unit long and its coordinates lie within ±180 and ±90, as degrees of longitude and latitude would: the ground profile along it would then be almost no length.',
    check:
      "Give the corridor in a projected coordinate system, x and y in the corridor's units (m or ft).",
  },
  'yaml-warning': {
    title: 'YAML warning',
    meaning: 'The YAML reader reported something unusual in the file, without stopping.',
    check: 'Look at the line named in the message.',
  },
};

export function explain(code: string): WarningExplanation | null {
  return Object.prototype.hasOwnProperty.call(WARNING_EXPLANATIONS, code)
    ? WARNING_EXPLANATIONS[code]
    : null;
}
