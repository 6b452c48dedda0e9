import { Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'
import { linkTokenColumns } from './linkToken'

export class EmailConfirmation extends Model<InferAttributes<EmailConfirmation>, InferCreationAttributes<EmailConfirmation>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare tokenHash: string
  declare expiresAt: Date
  declare usedAt: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    EmailConfirmation.init(linkTokenColumns, { sequelize, tableName: 'email_confirmations' })
  }
}
