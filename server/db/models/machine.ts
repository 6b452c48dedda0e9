import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import type { Technique } from '#shared/types/studio'

export class Machine extends Model<InferAttributes<Machine>, InferCreationAttributes<Machine>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare needlePitchMm: number
  declare needles: number
  declare patterningWidth: number
  declare technique: CreationOptional<Technique>
  declare passesPerColour: CreationOptional<number>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Machine.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      needlePitchMm: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
      needles: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      patterningWidth: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      technique: { type: DataTypes.ENUM('together', 'colour-by-colour'), allowNull: false, defaultValue: 'together' },
      passesPerColour: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 2 },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'machines' })
  }
}
