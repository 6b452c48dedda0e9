import { DataTypes } from 'sequelize'

// The columns of a single-use mailed link (a password reset, an address confirmation).
export const linkTokenColumns = {
  id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
  userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
  tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
  expiresAt: { type: DataTypes.DATE(3), allowNull: false },
  usedAt: { type: DataTypes.DATE(3), allowNull: true },
  createdAt: DataTypes.DATE(3),
  updatedAt: DataTypes.DATE(3),
}
