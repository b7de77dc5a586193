import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

import type { LinkProfileInput } from '../../../shared/contract/cores';
import type { CoreMode, Limits } from '../../../shared/link-engine/limits';
import type { ModelConfig } from '../../../shared/numeric/model-config';
import type { VectorConfig } from '../../../shared/vectoring';

/**
 * A CORDIC core under test: how to talk to it (link profile), the reference-model configuration
 * its results are compared with, and the acceptance limits a session must meet. A `rotation` core
 * (cos/sin of an angle) has a `modelConfig` and no `vectorConfig`; a `vectoring` core (atan2 and
 * magnitude of a vector) the other way round. The mode is fixed when the core is created.
 */
export class Core extends Model<InferAttributes<Core>, InferCreationAttributes<Core>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare slug: string;
  // The JSON columns, as their schemas (shared/contract/cores.ts) check them on every write (the
  // link profile as written: rows stored by hand may leave its defaults out).
  declare mode: CreationOptional<CoreMode>;
  declare linkProfile: LinkProfileInput;
  declare modelConfig: ModelConfig | null;
  declare vectorConfig: CreationOptional<VectorConfig | null>;
  declare limits: Limits;
  declare baselineSessionId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initCore(sequelize: Sequelize) {
  Core.init(
    {
      id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
      name: { type: DataTypes.STRING(120), allowNull: false, validate: { len: [1, 120] } },
      slug: { type: DataTypes.STRING(64), allowNull: false, unique: true, validate: { is: /^[a-z0-9]+(?:-[a-z0-9]+)*$/ } },
      mode: { type: DataTypes.STRING(16), allowNull: false, defaultValue: 'rotation', validate: { isIn: [['rotation', 'vectoring']] } },
      linkProfile: { type: DataTypes.JSON, allowNull: false },
      modelConfig: { type: DataTypes.JSON, allowNull: true },
      vectorConfig: { type: DataTypes.JSON, allowNull: true, defaultValue: null },
      limits: { type: DataTypes.JSON, allowNull: false },
      baselineSessionId: { type: DataTypes.INTEGER, allowNull: true },
      createdAt: DataTypes.DATE,
      updatedAt: DataTypes.DATE,
    },
    { sequelize, tableName: 'cores', modelName: 'Core' },
  );
}
