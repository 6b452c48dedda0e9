import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize'
import type { ProjectPlanSnapshot, ProjectStatus, ProjectYarn } from '#shared/types/knit'
import { slotSymbols } from '#shared/piece/types'
import type { Piece } from './piece'
import type { User } from './user'
import { parsedJson } from './json'

export class Project extends Model<InferAttributes<Project>, InferCreationAttributes<Project>> {
  declare id: CreationOptional<number>
  declare studioId: number
  declare knitterId: number
  declare name: string
  declare status: CreationOptional<ProjectStatus>
  declare planSnapshot: ProjectPlanSnapshot
  declare machineId: number | null
  declare motifId: number | null
  declare yarns: ProjectYarn[]
  declare notes: CreationOptional<string>
  declare startedAt: CreationOptional<Date | null>
  declare finishedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  declare pieces?: NonAttribute<Piece[]>
  declare knitter?: NonAttribute<User>

  static initModel(sequelize: Sequelize) {
    Project.init({
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      knitterId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      status: { type: DataTypes.ENUM('planned', 'knitting', 'finished'), allowNull: false, defaultValue: 'planned' },
      planSnapshot: {
        type: DataTypes.JSON, allowNull: false,
        get() { return parsedJson<ProjectPlanSnapshot>(this.getDataValue('planSnapshot')) },
      },
      machineId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      motifId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      // Stored as slot letter → { yarnId, name, hex }; used as the list of slot yarns.
      yarns: {
        type: DataTypes.JSON, allowNull: false,
        get() { return yarnList(parsedJson(this.getDataValue('yarns'))) },
        set(list: ProjectYarn[]) {
          this.setDataValue('yarns', Object.fromEntries(list.map(y => [y.slot, { yarnId: y.yarnId, name: y.name, hex: y.hex }])) as never)
        },
      },
      notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'projects' })
  }
}

function yarnList(stored: Record<string, { yarnId?: number | null; name: string; hex: string }> | null): ProjectYarn[] {
  return Object.keys(stored ?? {}).sort().map((slot, i) => ({
    slot, name: stored![slot]!.name, hex: stored![slot]!.hex, symbol: slotSymbols[i] ?? slotSymbols[0], yarnId: stored![slot]!.yarnId ?? null,
  }))
}
