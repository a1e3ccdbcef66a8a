import type { QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Trends and latest levels read only checks that no later approved check corrects; finding the
 * correction of a check needs an index on corrects_check_id (few checks have one, hence partial).
 * Without it each lookup scans every check: at 30,000 checks the overview took minutes.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.sequelize.query(
			`CREATE INDEX condition_checks_corrects ON condition_checks (corrects_check_id) WHERE corrects_check_id IS NOT NULL`,
			{ transaction },
		);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		await qi.sequelize.query('DROP INDEX IF EXISTS condition_checks_corrects', { transaction });
	});
}
