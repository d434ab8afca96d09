/**
 * One vocabulary for results: a result's `status` (pass, fail, none, failed — the last also a
 * job state) becomes its `verdict`, in the core's codes (packages/core/src/verdict.ts), every
 * stored row converted: pass → meets, fail → below, none → no-requirement, failed → no-fs.
 * Sections keep the flat properties of their GeoJSON corridor feature, which the exports give
 * back as the command line's do.
 */
import { DataTypes, type QueryInterface } from 'sequelize';

/** Old result status → verdict. */
const TO_VERDICT: Record<string, string> = {
  pass: 'meets',
  fail: 'below',
  none: 'no-requirement',
  failed: 'no-fs',
};

async function convert(q: QueryInterface, map: Record<string, string>): Promise<void> {
  for (const [from, to] of Object.entries(map)) {
    await q.bulkUpdate('results', { verdict: to }, { verdict: from });
  }
}

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.renameColumn('results', 'status', 'verdict');
  await convert(q, TO_VERDICT);
  // json, not jsonb: the attributes come back in the order the corridor gave them
  await q.addColumn('sections', 'feature_properties', { type: DataTypes.JSON, allowNull: true });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('sections', 'feature_properties');
  await convert(q, Object.fromEntries(Object.entries(TO_VERDICT).map(([a, b]) => [b, a])));
  await q.renameColumn('results', 'verdict', 'status');
}
