import { DataTypes, type QueryInterface } from 'sequelize'

// Accounts, studios and roles, invitations, password resets, sign-in throttling.
export async function up({ context: qi }: { context: QueryInterface }) {
  const now = { type: DataTypes.DATE(3), allowNull: false }
  await qi.createTable('users', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    password_hash: { type: DataTypes.STRING(255), allowNull: false },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('studios', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    personal: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('memberships', {
    studio_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    role: { type: DataTypes.ENUM('owner', 'designer', 'knitter'), allowNull: false },
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('memberships', ['user_id'])
  await qi.createTable('invitations', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
    email: { type: DataTypes.STRING(254), allowNull: false },
    role: { type: DataTypes.ENUM('owner', 'designer', 'knitter'), allowNull: false },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    invited_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    expires_at: { type: DataTypes.DATE(3), allowNull: false },
    accepted_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('password_resets', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE(3), allowNull: false },
    used_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('sign_in_failures', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false },
    address: { type: DataTypes.STRING(64), allowNull: false },
    at: { type: DataTypes.DATE(3), allowNull: false },
  })
  await qi.addIndex('sign_in_failures', ['email', 'at'])
  await qi.addIndex('sign_in_failures', ['address', 'at'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['sign_in_failures', 'password_resets', 'invitations', 'memberships', 'studios', 'users']) await qi.dropTable(t)
}
