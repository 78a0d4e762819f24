// Review decisions.
import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ReviewDecision } from '../../shared/api/revisions';

/** One reviewer's decision on a revision. */
export class ReviewModel extends Model<InferAttributes<ReviewModel>, InferCreationAttributes<ReviewModel>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare reviewerId: number;
  declare decision: ReviewDecision;
  declare comment: string;
  declare createdAt: CreationOptional<Date>;
}

/**
 * Binds the model to a connection.
 * @param sequelize - the connection.
 */
export function initReviewModel(sequelize: Sequelize): void {
  ReviewModel.init(
    {
      id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
      revisionId: { type: DataTypes.INTEGER, allowNull: false, field: 'revision_id' },
      reviewerId: { type: DataTypes.INTEGER, allowNull: false, field: 'reviewer_id' },
      decision: { type: DataTypes.STRING(16), allowNull: false },
      comment: { type: DataTypes.TEXT, allowNull: false },
      createdAt: { type: DataTypes.DATE, field: 'created_at' },
    },
    { sequelize, tableName: 'reviews', modelName: 'Review', updatedAt: false },
  );
}
