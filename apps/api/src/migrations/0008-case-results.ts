/**
 * Results per design case: a station is analysed under every case its section lists, so a run's
 * result is the station's summary (its verdict over all cases, the governing case by name, its
 * FS, method, requirement and ratio, its own warnings) and a row per case in `case_results`,
 * keyed by the result row and the case's name, with what the filters read as columns (kind,
 * verdict, governing method and FS, required FS, ratio) and the case's reports as JSON
 * (methods, critical surface, search, warnings, drawdown, seismic).
 *
 * Every stored result becomes its single case: named by the case its input gave
 * (analysis.case) or `as given` (as designCases names a section's own settings), of the kind
 * its name says or `other`, with the result's reports, verdict and FS; the result row keeps the
 * summary, names that case as governing when it has an FS, and gives its reports up to it (one
 * home for each). Down puts the governing case's reports (the first case's when none governs)
 * back on the result row and drops the cases.
 */
import { DataTypes, type QueryInterface } from 'sequelize';
import { CASE_KINDS } from '@scarpline/core/result';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  const json = (allowNull: boolean) => ({ type: DataTypes.JSONB, allowNull });
  await q.createTable('case_results', {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    result_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: 'results', key: 'id' },
      onDelete: 'CASCADE',
    },
    /** The case's place in the section's list. */
    position: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    kind: { type: DataTypes.STRING, allowNull: false },
    verdict: { type: DataTypes.STRING, allowNull: false },
    governing_method: { type: DataTypes.STRING, allowNull: true },
    governing_fs: { type: DataTypes.DOUBLE, allowNull: true },
    required_fs: { type: DataTypes.DOUBLE, allowNull: true },
    ratio: { type: DataTypes.DOUBLE, allowNull: true },
    governs: json(false),
    methods: json(false),
    critical_surface: json(true),
    search: json(true),
    warnings: json(false),
    drawdown: json(true),
    seismic: json(true),
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  // One row per result and case: a retried job overwrites, never duplicates.
  await q.addIndex('case_results', ['result_id', 'name'], { unique: true });
  await q.addColumn('results', 'governing_case', { type: DataTypes.TEXT, allowNull: true });
  await q.addColumn('results', 'ratio', { type: DataTypes.DOUBLE, allowNull: true });
  await q.changeColumn('results', 'methods', json(true));
  const db = q.sequelize;
  await db.query(
    `INSERT INTO case_results (result_id, position, name, kind, verdict, governing_method,
       governing_fs, required_fs, ratio, governs, methods, critical_surface, search, warnings,
       created_at, updated_at)
     SELECT r.id, 0, n.name, CASE WHEN n.name = ANY($1::text[]) THEN n.name ELSE 'other' END,
       r.verdict, r.governing_method, r.governing_fs, r.required_fs,
       CASE WHEN r.verdict <> 'no-slope' THEN r.governing_fs / r.required_fs END,
       (SELECT coalesce(jsonb_agg(m -> 'method'), '[]'::jsonb)
          FROM jsonb_array_elements(r.methods) m WHERE m -> 'method' IS NOT NULL),
       r.methods, r.critical_surface, r.search, r.warnings, r.created_at, r.updated_at
       FROM results r JOIN sections s ON s.id = r.section_id,
       LATERAL (SELECT coalesce(coalesce(r.input, s.input) -> 'analysis' ->> 'case', 'as given')
                  AS name) n`,
    { bind: [CASE_KINDS] },
  );
  await db.query(
    `UPDATE results r SET governing_case = c.name, ratio = c.ratio
       FROM case_results c
      WHERE c.result_id = r.id AND r.governing_fs IS NOT NULL AND r.verdict <> 'no-slope'`,
  );
  await db.query(
    `UPDATE results SET methods = NULL, critical_surface = NULL, search = NULL, warnings = '[]'`,
  );
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  const db = q.sequelize;
  await db.query(
    `UPDATE results r SET methods = c.methods, critical_surface = c.critical_surface,
       search = c.search, warnings = c.warnings || r.warnings
       FROM (SELECT DISTINCT ON (c.result_id) c.* FROM case_results c JOIN results r ON r.id = c.result_id
              ORDER BY c.result_id, (c.name = r.governing_case) IS TRUE DESC, c.position) c
      WHERE c.result_id = r.id`,
  );
  await db.query(`UPDATE results SET methods = '[]' WHERE methods IS NULL`);
  await q.changeColumn('results', 'methods', { type: DataTypes.JSONB, allowNull: false });
  await q.removeColumn('results', 'ratio');
  await q.removeColumn('results', 'governing_case');
  await q.dropTable('case_results');
}
