/** @scarpline/core — the pure solver: section model, geometry, slicing, methods. */
export * from './model/types';

// --- input: parsing, validation, units, normalisation ---

// --- geometry and slicing ---
