// Binds every model to the connection.
import type { Sequelize } from 'sequelize';
import { initUserModel } from '../users/model';
import { initDesignModel } from '../designs/model';
import { initRevisionModel } from '../revisions/model';
import { initReviewModel } from '../reviews/model';
import { initReleaseModel } from '../releases/model';
import { initAccessTokenModel } from '../tokens/model';
import { initAuditEventModel } from '../audit/model';
import { initMailMessageModel } from '../mail/model';
import { initRevisionSimulationModel } from '../simulation/model';

/**
 * Initialises all models on one connection.
 * @param sequelize - the connection.
 */
export function initModels(sequelize: Sequelize): void {
  initUserModel(sequelize);
  initDesignModel(sequelize);
  initRevisionModel(sequelize);
  initReviewModel(sequelize);
  initReleaseModel(sequelize);
  initAccessTokenModel(sequelize);
  initAuditEventModel(sequelize);
  initMailMessageModel(sequelize);
  initRevisionSimulationModel(sequelize);
}
