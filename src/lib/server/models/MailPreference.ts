import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A user's choice of optional mail; a user without a row gets every kind (all default on). */
export class MailPreference extends Model<InferAttributes<MailPreference>, InferCreationAttributes<MailPreference>> {
	declare userId: string;
	declare checkSubmitted: CreationOptional<boolean>;
	declare checkReturned: CreationOptional<boolean>;
	declare checkApproved: CreationOptional<boolean>;
	declare riskSubmitted: CreationOptional<boolean>;
	declare riskReviewed: CreationOptional<boolean>;
	declare dueDigest: CreationOptional<boolean>;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		// A new object per column: init() writes each column's name into its definition.
		const on = () => ({ type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true });
		MailPreference.init(
			{
				userId: { type: DataTypes.UUID, primaryKey: true },
				checkSubmitted: on(),
				checkReturned: on(),
				checkApproved: on(),
				riskSubmitted: on(),
				riskReviewed: on(),
				dueDigest: on(),
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'mail_preferences', createdAt: false },
		);
	}
}
