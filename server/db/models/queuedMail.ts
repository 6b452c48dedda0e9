import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize'

// A mail waiting to be sent, or the record of one sent (the limits count these rows).
export class QueuedMail extends Model<InferAttributes<QueuedMail>, InferCreationAttributes<QueuedMail>> {
  declare id: CreationOptional<number>
  declare kind: string
  declare toAddress: string
  declare senderUserId: number | null
  declare senderAddress: string
  declare studioId: number | null
  declare subject: CreationOptional<string>
  declare body: string | null
  declare attempts: CreationOptional<number>
  declare nextAttemptAt: Date
  declare sentAt: CreationOptional<Date | null>
  declare failedAt: CreationOptional<Date | null>
  declare lastError: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>

  static initModel(sequelize: Sequelize) {
    QueuedMail.init({
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      kind: { type: DataTypes.STRING(40), allowNull: false },
      toAddress: { type: DataTypes.STRING(254), allowNull: false },
      senderUserId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      senderAddress: { type: DataTypes.STRING(64), allowNull: false, defaultValue: '' },
      studioId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      subject: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
      body: { type: DataTypes.TEXT, allowNull: true },
      attempts: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 0 },
      nextAttemptAt: { type: DataTypes.DATE(3), allowNull: false },
      sentAt: { type: DataTypes.DATE(3), allowNull: true },
      failedAt: { type: DataTypes.DATE(3), allowNull: true },
      lastError: { type: DataTypes.STRING(255), allowNull: true },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    }, { sequelize, tableName: 'mail_queue' })
  }
}
