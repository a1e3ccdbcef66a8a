import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * The foundation tables: people and their sessions, sign-in throttling, one-time tokens, the mail
 * outbox, storage locations, specimens and the audit trail. One transaction, so a failed migration
 * leaves nothing half made.
 */
type Ctx = MigrationParams<QueryInterface>;

const ROLES = "('conservator','reviewer','curator','admin')";


export async function up({ context: qi }: Ctx): Promise<void> {
	const now = { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') };
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'users',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
				name: { type: DataTypes.STRING(120), allowNull: false },
				role: { type: DataTypes.STRING(20), allowNull: false },
				password_hash: { type: DataTypes.TEXT, allowNull: true },
				disabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
				last_sign_in_at: { type: DataTypes.DATE, allowNull: true },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE users ADD CONSTRAINT users_role_check CHECK (role IN ${ROLES}),
			 ADD CONSTRAINT users_email_lower CHECK (email = lower(email))`,
			o,
		);
		await qi.createTable(
			'user_sessions',
			{
				id: { type: DataTypes.TEXT, primaryKey: true },
				user_id: {
					type: DataTypes.UUID,
					allowNull: false,
					references: { model: 'users', key: 'id' },
					onDelete: 'CASCADE',
				},
				expires_at: { type: DataTypes.DATE, allowNull: false },
				created_at: now,
				user_agent: { type: DataTypes.STRING(300), allowNull: true },
			},
			o,
		);
		await qi.addIndex('user_sessions', ['user_id'], o);
		await qi.createTable(
			'login_throttles',
			{
				key: { type: DataTypes.STRING(320), primaryKey: true },
				failures: { type: DataTypes.INTEGER, allowNull: false },
				window_start: { type: DataTypes.DATE, allowNull: false },
				blocked_until: { type: DataTypes.DATE, allowNull: true },
				updated_at: now,
			},
			o,
		);
		await qi.createTable(
			'auth_tokens',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				user_id: {
					type: DataTypes.UUID,
					allowNull: false,
					references: { model: 'users', key: 'id' },
					onDelete: 'CASCADE',
				},
				purpose: { type: DataTypes.STRING(10), allowNull: false },
				// Only a SHA-256 of the token is kept: a copy of the database cannot be used to sign in.
				token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
				expires_at: { type: DataTypes.DATE, allowNull: false },
				used_at: { type: DataTypes.DATE, allowNull: true },
				created_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE auth_tokens ADD CONSTRAINT auth_tokens_purpose_check CHECK (purpose IN ('invite','reset'))`,
			o,
		);
		await qi.createTable(
			'outgoing_mail',
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				to_address: { type: DataTypes.STRING(254), allowNull: false },
				subject: { type: DataTypes.STRING(300), allowNull: false },
				text_body: { type: DataTypes.TEXT, allowNull: false },
				status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'queued' },
				attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				next_attempt_at: now,
				last_error: { type: DataTypes.TEXT, allowNull: true },
				created_at: now,
				sent_at: { type: DataTypes.DATE, allowNull: true },
			},
			o,
		);
		await qi.addIndex('outgoing_mail', ['status', 'next_attempt_at'], o);
		await qi.createTable(
			'storage_locations',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
				name: { type: DataTypes.STRING(200), allowNull: false },
				notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.createTable(
			'specimens',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				object_number: { type: DataTypes.STRING(40), allowNull: false, unique: true },
				title: { type: DataTypes.STRING(200), allowNull: false },
				description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
				department: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
				storage_location_id: {
					type: DataTypes.UUID,
					allowNull: true,
					references: { model: 'storage_locations', key: 'id' },
					onDelete: 'RESTRICT',
				},
				preservative_recorded: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
				preservative_kind: { type: DataTypes.STRING(20), allowNull: false },
				container_shape: { type: DataTypes.STRING(12), allowNull: false },
				inner_width_mm: { type: DataTypes.DECIMAL(7, 1), allowNull: false },
				inner_depth_mm: { type: DataTypes.DECIMAL(7, 1), allowNull: true },
				inner_height_mm: { type: DataTypes.DECIMAL(7, 1), allowNull: false },
				container_material: { type: DataTypes.STRING(14), allowNull: false },
				closure_type: { type: DataTypes.STRING(24), allowNull: false },
				seal_type: { type: DataTypes.STRING(10), allowNull: false },
				hazards: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
				next_check_due: { type: DataTypes.DATEONLY, allowNull: true },
				version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				created_at: now,
				updated_at: now,
				deleted_at: { type: DataTypes.DATE, allowNull: true },
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE specimens
			 ADD CONSTRAINT specimens_shape_check CHECK (container_shape IN ('cylinder','oval','rectangular')),
			 ADD CONSTRAINT specimens_material_check CHECK (container_material IN ('soda-lime','borosilicate','acrylic')),
			 ADD CONSTRAINT specimens_seal_check CHECK (seal_type IN ('pitch','silicone','wax','gasket','unknown')),
			 ADD CONSTRAINT specimens_dims_check CHECK (inner_width_mm > 0 AND inner_height_mm > 0
			   AND (inner_depth_mm IS NULL OR inner_depth_mm > 0)),
			 ADD CONSTRAINT specimens_hazards_array CHECK (jsonb_typeof(hazards) = 'array')`,
			o,
		);
		await qi.addIndex('specimens', ['storage_location_id'], o);
		await qi.addIndex('specimens', ['next_check_due'], o);
		await qi.createTable(
			'audit_events',
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				occurred_at: now,
				actor_id: {
					type: DataTypes.UUID,
					allowNull: true,
					references: { model: 'users', key: 'id' },
					onDelete: 'SET NULL',
				},
				action: { type: DataTypes.STRING(60), allowNull: false },
				entity_type: { type: DataTypes.STRING(40), allowNull: false },
				entity_id: { type: DataTypes.STRING(80), allowNull: true },
				before: { type: DataTypes.JSONB, allowNull: true },
				after: { type: DataTypes.JSONB, allowNull: true },
				client_address: { type: DataTypes.STRING(64), allowNull: true },
			},
			o,
		);
		await qi.addIndex('audit_events', ['entity_type', 'entity_id'], o);
		await qi.addIndex('audit_events', ['occurred_at'], o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		for (const t of [
			'audit_events',
			'specimens',
			'storage_locations',
			'outgoing_mail',
			'auth_tokens',
			'login_throttles',
			'user_sessions',
			'users',
		]) {
			await qi.dropTable(t, { transaction });
		}
	});
}
