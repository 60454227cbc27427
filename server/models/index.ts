import type { Sequelize } from 'sequelize';
import { LabModel } from './lab';

export { LabModel };

export function initModels(sequelize: Sequelize): void {
  LabModel.initModel(sequelize);
}
