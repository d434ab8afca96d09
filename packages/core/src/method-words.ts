/**
 * Each method of analysis in words for a reader of a report: its name as published, what it
 * satisfies and assumes, and the publications it comes from (the registry's short `reference`
 * tags, written out; citations from memory of the published papers and books). Free of
 * imports but a type, so that any surface can show them without the solver.
 */
import type { MethodId } from './model/types';

export interface MethodWords {
  /** The method's published name. */
  name: string;
  /** What it satisfies and assumes, in a sentence. */
  basis: string;
  /** The publications, in full. */
  references: string[];
}

export const METHOD_WORDS: Readonly<Record<MethodId, MethodWords>> = {
  ordinary: {
    name: 'Ordinary method of slices (Fellenius)',
    basis:
      'Moment equilibrium about the circle centre; interslice forces neglected, the base normal force from the weight resolved normal to the base.',
    references: [
      'Fellenius, W. (1936). Calculation of the stability of earth dams. Transactions, 2nd Congress on Large Dams, Washington, 4, 445–462.',
    ],
  },
  bishop: {
    name: "Bishop's simplified method",
    basis:
      'Moment equilibrium about the circle centre and vertical force equilibrium of each slice; interslice shear forces neglected.',
    references: [
      'Bishop, A. W. (1955). The use of the slip circle in the stability analysis of slopes. Géotechnique 5(1), 7–17.',
    ],
  },
  janbu: {
    name: "Janbu's simplified method (with the correction factor f0)",
    basis:
      'Horizontal and vertical force equilibrium of each slice; interslice shear neglected, then corrected by the empirical factor f0.',
    references: [
      'Janbu, N. (1954). Application of composite slip surfaces for stability analysis. Proceedings, European Conference on Stability of Earth Slopes, Stockholm, 3, 43–49.',
      'Janbu, N. (1973). Slope stability computations. In Embankment-Dam Engineering (Casagrande volume), Wiley, New York, 47–86.',
    ],
  },
  spencer: {
    name: "Spencer's method",
    basis:
      'Force and moment equilibrium; interslice forces parallel, at one inclination θ found with the factor of safety.',
    references: [
      'Spencer, E. (1967). A method of analysis of the stability of embankments assuming parallel inter-slice forces. Géotechnique 17(1), 11–26.',
    ],
  },
  'morgenstern-price': {
    name: 'Morgenstern–Price method',
    basis:
      'Force and moment equilibrium; interslice shear X = λ f(x) E with a chosen function f(x), λ found with the factor of safety.',
    references: [
      'Morgenstern, N. R. & Price, V. E. (1965). The analysis of the stability of general slip surfaces. Géotechnique 15(1), 79–93.',
      'Fredlund, D. G. & Krahn, J. (1977). Comparison of slope stability methods of analysis. Canadian Geotechnical Journal 14(3), 429–439.',
    ],
  },
  'phi-zero-circle': {
    name: 'φ = 0 circle (total stress)',
    basis:
      'Moment equilibrium of the whole sliding mass about the circle centre with the undrained strength along the arc.',
    references: [
      'Fellenius, W. (1936). Calculation of the stability of earth dams. Transactions, 2nd Congress on Large Dams, Washington, 4, 445–462.',
      'Petterson, K. E. (1955). The early history of circular sliding surfaces. Géotechnique 5(4), 275–296.',
    ],
  },
  'log-spiral': {
    name: 'Logarithmic spiral',
    basis:
      'Moment equilibrium about the pole of a log spiral at the friction angle, on which the resultant of normal and frictional stress passes through the pole.',
    references: [
      'Rendulic, L. (1935). Ein Beitrag zur Bestimmung der Gleitsicherheit. Der Bauingenieur 16, 230–233.',
      'Taylor, D. W. (1937). Stability of earth slopes. Journal of the Boston Society of Civil Engineers 24(3), 197–246.',
      'Chen, W. F. (1975). Limit Analysis and Soil Plasticity. Elsevier, Amsterdam.',
    ],
  },
  'infinite-slope': {
    name: 'Infinite slope',
    basis:
      'Equilibrium of a slab parallel to the ground surface, with seepage parallel to the slope at the given water ratio.',
    references: [
      'Skempton, A. W. & DeLory, F. A. (1957). Stability of natural slopes in London Clay. Proceedings, 4th International Conference on Soil Mechanics and Foundation Engineering, London, 2, 378–381.',
    ],
  },
};
