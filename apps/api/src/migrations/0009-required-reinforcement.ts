/**
 * The extra reinforcement a design case below its requirement needs, where its section asks
 * for it (the core's RequiredReinforcementReport), kept with the case's other reports. Results
 * stored before have none (null).
 */
import { DataTypes, type QueryInterface } from 'sequelize';

export async function up({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.addColumn('case_results', 'required_reinforcement', {
    type: DataTypes.JSONB,
    allowNull: true,
  });
}

export async function down({ context: q }: { context: QueryInterface }): Promise<void> {
  await q.removeColumn('case_results', 'required_reinforcement');
}
