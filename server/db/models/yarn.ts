import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

export class Yarn extends Model<InferAttributes<Yarn>, InferCreationAttributes<Yarn>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare hex: string
  declare weightCategory: number
  declare metresPer100g: number
  declare gramsOnHand: CreationOptional<number>
  declare notes: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    Yarn.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      hex: { type: DataTypes.CHAR(7), allowNull: false },
      weightCategory: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
      metresPer100g: { type: DataTypes.DECIMAL(7, 1), allowNull: false, field: 'metres_per_100g' },
      gramsOnHand: { type: DataTypes.DECIMAL(8, 1), allowNull: false, defaultValue: 0 },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'yarns' })
  }
}
