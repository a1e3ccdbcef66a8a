import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationParams } from 'umzug';

/**
 * Photographs as evidence. `photo_uploads` follows each tus upload from its creation to a recorded
 * photo or a refusal, so the uploader can say why a file was refused and the reconciler can find
 * uploads that finished on disk but were never recorded. `photos` holds one row per master original
 * (never re-encoded, never deleted: the database refuses it), `photo_derivatives` the thumbnail,
 * display copy and tile pyramid made from it, replaced as a set. `photo_fixity_checks` is the trail of
 * the worker's periodic re-hashing of every master, which would show a file silently altered on disk.
 */
type Ctx = MigrationParams<QueryInterface>;

export async function up({ context: qi }: Ctx): Promise<void> {
	const now = { type: DataTypes.DATE, allowNull: false, defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP') };
	const ref = (model: string, allowNull: boolean, type = DataTypes.UUID) => ({ type, allowNull, references: { model, key: 'id' }, onDelete: 'RESTRICT' });
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.createTable(
			'photos',
			{
				id: { type: DataTypes.UUID, primaryKey: true, defaultValue: qi.sequelize.literal('gen_random_uuid()') },
				upload_id: { type: DataTypes.STRING(64), allowNull: false, unique: true },
				specimen_id: ref('specimens', false),
				check_id: ref('condition_checks', true),
				view: { type: DataTypes.STRING(12), allowNull: false },
				stage: { type: DataTypes.STRING(20), allowNull: false },
				file_name: { type: DataTypes.STRING(255), allowNull: false },
				media_type: { type: DataTypes.STRING(40), allowNull: false },
				byte_size: { type: DataTypes.BIGINT, allowNull: false },
				sha256: { type: DataTypes.CHAR(64), allowNull: false },
				master_path: { type: DataTypes.STRING(300), allowNull: false },
				// Pixel size as seen, i.e. after the EXIF orientation is applied.
				width: { type: DataTypes.INTEGER, allowNull: false },
				height: { type: DataTypes.INTEGER, allowNull: false },
				orientation: { type: DataTypes.SMALLINT, allowNull: true },
				captured_raw: { type: DataTypes.STRING(40), allowNull: true },
				captured_offset: { type: DataTypes.STRING(10), allowNull: true },
				captured_at: { type: DataTypes.DATE, allowNull: true },
				camera: { type: DataTypes.STRING(200), allowNull: true },
				lens: { type: DataTypes.STRING(200), allowNull: true },
				exif: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
				derivative_set: { type: DataTypes.STRING(40), allowNull: false },
				uploaded_by: ref('users', false),
				uploaded_at: { type: DataTypes.DATE, allowNull: false },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE photos
			 ADD CONSTRAINT photos_view_check CHECK (view IN ('front','back','left','right','top','base','label','detail')),
			 ADD CONSTRAINT photos_stage_check CHECK (stage IN ('as-found','before-treatment','after-treatment')),
			 ADD CONSTRAINT photos_sha_check CHECK (sha256 ~ '^[0-9a-f]{64}$'),
			 ADD CONSTRAINT photos_size_check CHECK (byte_size > 0 AND width > 0 AND height > 0)`,
			o,
		);
		await qi.addIndex('photos', ['specimen_id', 'created_at'], o);
		await qi.addIndex('photos', ['check_id'], o);
		await qi.addIndex('photos', ['sha256'], o);
		// Evidence stays: a photo row cannot be deleted, and only its derivative set may change.
		await qi.sequelize.query(
			`CREATE FUNCTION photos_immutable() RETURNS trigger AS $$
			 BEGIN
			   IF TG_OP = 'DELETE' THEN RAISE EXCEPTION 'a recorded photograph cannot be deleted'; END IF;
			   IF (to_jsonb(NEW) - 'derivative_set' - 'updated_at') IS DISTINCT FROM (to_jsonb(OLD) - 'derivative_set' - 'updated_at') THEN
			     RAISE EXCEPTION 'a recorded photograph cannot be changed';
			   END IF;
			   RETURN NEW;
			 END $$ LANGUAGE plpgsql;
			 CREATE TRIGGER photos_immutable BEFORE UPDATE OR DELETE ON photos
			   FOR EACH ROW EXECUTE FUNCTION photos_immutable();`,
			o,
		);
		await qi.createTable(
			'photo_derivatives',
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				photo_id: { ...ref('photos', false), onDelete: 'CASCADE' },
				kind: { type: DataTypes.STRING(12), allowNull: false },
				set_id: { type: DataTypes.STRING(40), allowNull: false },
				path: { type: DataTypes.STRING(300), allowNull: false },
				media_type: { type: DataTypes.STRING(40), allowNull: false },
				width: { type: DataTypes.INTEGER, allowNull: false },
				height: { type: DataTypes.INTEGER, allowNull: false },
				byte_size: { type: DataTypes.BIGINT, allowNull: false },
				created_at: now,
			},
			o,
		);
		await qi.sequelize.query(`ALTER TABLE photo_derivatives ADD CONSTRAINT photo_derivatives_kind_check CHECK (kind IN ('thumbnail','display','tiles'))`, o);
		await qi.addIndex('photo_derivatives', ['photo_id', 'kind'], { ...o, unique: true });
		await qi.createTable(
			'photo_uploads',
			{
				id: { type: DataTypes.STRING(64), primaryKey: true },
				specimen_id: ref('specimens', false),
				check_id: ref('condition_checks', true),
				view: { type: DataTypes.STRING(12), allowNull: false },
				stage: { type: DataTypes.STRING(20), allowNull: false },
				file_name: { type: DataTypes.STRING(255), allowNull: false },
				declared_type: { type: DataTypes.STRING(100), allowNull: true },
				declared_size: { type: DataTypes.BIGINT, allowNull: false },
				client_sha256: { type: DataTypes.CHAR(64), allowNull: true },
				uploader_id: ref('users', false),
				state: { type: DataTypes.STRING(12), allowNull: false, defaultValue: 'receiving' },
				refusal_code: { type: DataTypes.STRING(20), allowNull: true },
				reason: { type: DataTypes.TEXT, allowNull: true },
				photo_id: ref('photos', true),
				finished_at: { type: DataTypes.DATE, allowNull: true },
				created_at: now,
				updated_at: now,
			},
			o,
		);
		await qi.sequelize.query(
			`ALTER TABLE photo_uploads
			 ADD CONSTRAINT photo_uploads_state_check CHECK (state IN ('receiving','processing','recorded','refused','quarantined')),
			 ADD CONSTRAINT photo_uploads_recorded_check CHECK ((state = 'recorded') = (photo_id IS NOT NULL))`,
			o,
		);
		await qi.createTable(
			'photo_fixity_checks',
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				photo_id: { ...ref('photos', false), onDelete: 'CASCADE' },
				checked_at: now,
				outcome: { type: DataTypes.STRING(10), allowNull: false },
				sha256_seen: { type: DataTypes.CHAR(64), allowNull: true },
				detail: { type: DataTypes.TEXT, allowNull: true },
			},
			o,
		);
		await qi.sequelize.query(`ALTER TABLE photo_fixity_checks ADD CONSTRAINT photo_fixity_outcome_check CHECK (outcome IN ('match','mismatch','missing'))`, o);
		await qi.addIndex('photo_fixity_checks', ['photo_id', 'checked_at'], o);
		await qi.addIndex('photo_uploads', ['uploader_id', 'created_at'], o);
		await qi.addIndex('photo_uploads', ['state'], o);
	});
}

export async function down({ context: qi }: Ctx): Promise<void> {
	await qi.sequelize.transaction(async (transaction) => {
		const o = { transaction };
		await qi.dropTable('photo_fixity_checks', o);
		await qi.dropTable('photo_uploads', o);
		await qi.dropTable('photo_derivatives', o);
		await qi.dropTable('photos', o);
		await qi.sequelize.query('DROP FUNCTION IF EXISTS photos_immutable()', o);
	});
}
