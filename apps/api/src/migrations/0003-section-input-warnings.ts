/**
 * Sections keep the warnings the input checks gave about them (located messages: file, line,
 * column, path), so they can be read with the section after the submission has been answered.
 */
import { DataTypes, literal, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn('sections', 'input_warnings', {
    type: DataTypes.JSONB,
    allowNull: false,
    defaultValue: literal("'[]'::jsonb"),
  });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('sections', 'input_warnings');
}
