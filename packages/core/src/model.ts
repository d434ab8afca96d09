/**
 * `@scarpline/core/model`: the normalised section as the solver takes it (types, and the list
 * of method ids) and the section as a file writes it. Types and constants only, browser-safe.
 */
export * from './model/types';
export type * from './model/raw-section';
export {
  reinforcementDocument,
  requiredReinforcementDocument,
} from './model/reinforcement-document';
export { caseKindOf, caseSection, designCases, sectionOfCase } from './model/design-cases';
export {
  RENAMED_METHODS,
  FORMER_INTERSLICE_SHAPES,
  formerInterslice,
  intersliceText,
  renamedWords,
} from './model/renamed';
