import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Who did what to which record, when, with the values before and after. Never updated. */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
	declare id: CreationOptional<number>;
	declare occurredAt: CreationOptional<Date>;
	declare actorId: string | null;
	declare action: string;
	declare entityType: string;
	declare entityId: string | null;
	declare before: unknown;
	declare after: unknown;
	declare clientAddress: string | null;

	static initModel(sequelize: Sequelize) {
		AuditEvent.init(
			{
				id: { type: DataTypes.BIGINT, primaryKey: true, autoIncrement: true },
				occurredAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
				actorId: { type: DataTypes.UUID, allowNull: true },
				action: { type: DataTypes.STRING(60), allowNull: false },
				entityType: { type: DataTypes.STRING(40), allowNull: false },
				entityId: { type: DataTypes.STRING(80), allowNull: true },
				before: { type: DataTypes.JSONB, allowNull: true },
				after: { type: DataTypes.JSONB, allowNull: true },
				clientAddress: { type: DataTypes.STRING(64), allowNull: true },
			},
			{ sequelize, tableName: 'audit_events', timestamps: false },
		);
	}
}
