import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Grade } from '../../check/vocabulary.ts';

/** Months to the next check for a grade, when the administrator has changed the default. */
export class GradeInterval extends Model<InferAttributes<GradeInterval>, InferCreationAttributes<GradeInterval>> {
	declare grade: Grade;
	declare months: number;
	declare updatedAt: CreationOptional<Date>;

	static initModel(sequelize: Sequelize) {
		GradeInterval.init(
			{
				grade: { type: DataTypes.STRING(12), primaryKey: true },
				months: { type: DataTypes.INTEGER, allowNull: false },
				updatedAt: DataTypes.DATE,
			},
			{ sequelize, tableName: 'grade_intervals', createdAt: false },
		);
	}
}
