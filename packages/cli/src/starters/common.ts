/** The comment block every starter file opens with. */
export const HEAD = `# A Scarpline section file (format scarpline/1): one 2-D cross-section, x to the right,
# y up, in one unit system. Every value below is an invented starting point, not data:
# replace each with your own. Check it with \`scarpline validate FILE\`, then
# \`scarpline analyze FILE\` or \`scarpline plot FILE --svg FILE.svg\`.
# schemas/section.schema.json describes every field.
`;

/** The analysis block's comments shared by the starters. */
export const SURFACE_NOTE = `  # The slip surface: a given circle (centre [x, y] and radius) or a polyline
  # { type: polyline, points: [[x, y], ...] }. Leave surface out (or write { type: auto })
  # to let the program search for the critical surface.`;
