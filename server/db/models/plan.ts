import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { PieceShape, PlanSection, PlanYarnSlot } from '#shared/types/plan'
import type { LengthUnit } from '#shared/types/stock'
import { parsedJson } from './json'
import type { User } from './user'

export class Plan extends Model<InferAttributes<Plan>, InferCreationAttributes<Plan>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare name: string
  declare machineId: number | null
  declare swatchId: number | null
  declare yarns: PlanYarnSlot[]
  /** Size names in order (migration 0008 made every older plan 'One size'). */
  declare sizes: CreationOptional<string[]>
  declare floatLimit: CreationOptional<number>
  declare published: CreationOptional<boolean>
  declare notes: CreationOptional<string>
  /** Bumped by every change, in the UPDATE that checks it (server/utils/editVersions.ts). */
  declare version: CreationOptional<number>
  declare createdBy: number | null
  declare updatedBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
  declare pieces?: NonAttribute<PlanPiece[]>
  declare creator?: NonAttribute<User | null>
  declare editor?: NonAttribute<User | null>

  static initModel(sequelize: Sequelize) {
    Plan.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      machineId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      swatchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      yarns: {
        type: DataTypes.JSON, allowNull: false,
        get() { return parsedJson<PlanYarnSlot[]>(this.getDataValue('yarns')) ?? [] },
      },
      sizes: {
        type: DataTypes.JSON, allowNull: false, defaultValue: ['One size'],
        get() { return parsedJson<string[] | null>(this.getDataValue('sizes')) ?? ['One size'] },
      },
      floatLimit: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 5 },
      published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'plans' })
  }
}

export class PlanPiece extends Model<InferAttributes<PlanPiece>, InferCreationAttributes<PlanPiece>> {
  declare id: CreationOptional<number>
  declare planId: number
  declare name: string
  declare position: number
  declare copies: number
  declare targetWidth: number
  declare targetLength: number
  declare unit: LengthUnit
  declare ease: number
  declare sections: PlanSection[]
  /** Null: a rectangle. */
  declare shape: CreationOptional<PieceShape | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    PlanPiece.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      planId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      copies: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 1 },
      targetWidth: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
      targetLength: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
      unit: { type: DataTypes.ENUM('cm', 'in'), allowNull: false },
      ease: { type: DataTypes.DECIMAL(6, 2), allowNull: false, defaultValue: 0 },
      sections: {
        type: DataTypes.JSON, allowNull: false,
        get() { return parsedJson<PlanSection[]>(this.getDataValue('sections')) },
      },
      shape: {
        type: DataTypes.JSON, allowNull: true, defaultValue: null,
        get() { return parsedJson<PieceShape | null>(this.getDataValue('shape')) ?? null },
      },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'plan_pieces' })
  }
}
