import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * The outbox: a message is written here in the same transaction as the change that causes it, and
 * a sender delivers it afterwards with retries, so a mail server that is down never loses a
 * message or undoes the change.
 */
export class OutgoingMail extends Model<InferAttributes<OutgoingMail>, InferCreationAttributes<OutgoingMail>> {
	declare id: CreationOptional<number>;
	declare toAddress: string;
	declare subject: string;
	declare textBody: string;
	/** The simple HTML part, or null for plain-text-only mail. */
	declare htmlBody: CreationOptional<string | null>;
	declare status: CreationOptional<'queued' | 'sent' | 'failed'>;
	declare attempts: CreationOptional<number>;
	declare nextAttemptAt: CreationOptional<Date>;
	declare lastError: string | null;
	declare createdAt: CreationOptional<Date>;
	declare sentAt: Date | null;

	static initModel(sequelize: Sequelize) {
		OutgoingMail.init(
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				toAddress: { type: DataTypes.STRING(254), allowNull: false },
				subject: { type: DataTypes.STRING(300), allowNull: false },
				textBody: { type: DataTypes.TEXT, allowNull: false },
				htmlBody: { type: DataTypes.TEXT, allowNull: true },
				status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: 'queued' },
				attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
				nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
				lastError: { type: DataTypes.TEXT, allowNull: true },
				createdAt: DataTypes.DATE,
				sentAt: { type: DataTypes.DATE, allowNull: true },
			},
			{ sequelize, tableName: 'outgoing_mail', updatedAt: false },
		);
	}
}
