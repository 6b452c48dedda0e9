import { DataTypes, type QueryInterface } from 'sequelize'

// Revocable sessions, confirmed addresses and a mail queue (sent after the answer, counted for limits).
export async function up({ context: qi }: { context: QueryInterface }) {
  const now = { type: DataTypes.DATE(3), allowNull: false }
  const person = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' }
  await qi.createTable('user_sessions', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: person,
    // sha256 of the id the sealed cookie carries: a copy of this table opens no session.
    sid_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    device: { type: DataTypes.STRING(120), allowNull: false, defaultValue: '' },
    address: { type: DataTypes.STRING(64), allowNull: false, defaultValue: '' },
    last_seen_at: now,
    ended_at: { type: DataTypes.DATE(3), allowNull: true },
    end_reason: { type: DataTypes.STRING(40), allowNull: true },
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('user_sessions', ['user_id', 'ended_at'])

  // Accounts made before confirmation existed count as confirmed from their creation.
  await qi.addColumn('users', 'email_confirmed_at', { type: DataTypes.DATE(3), allowNull: true })
  await qi.sequelize.query('UPDATE users SET email_confirmed_at = created_at')
  await qi.createTable('email_confirmations', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: person,
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: DataTypes.DATE(3), allowNull: false },
    used_at: { type: DataTypes.DATE(3), allowNull: true },
    created_at: now,
    updated_at: now,
  })

  await qi.createTable('mail_queue', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    to_address: { type: DataTypes.STRING(254), allowNull: false },
    // Who caused it, for the limits: a signed-in person, the network address, a studio.
    sender_user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    sender_address: { type: DataTypes.STRING(64), allowNull: false, defaultValue: '' },
    studio_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    subject: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
    // Emptied once sent: links in it are secrets.
    body: { type: DataTypes.TEXT, allowNull: true },
    attempts: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 0 },
    next_attempt_at: now,
    sent_at: { type: DataTypes.DATE(3), allowNull: true },
    failed_at: { type: DataTypes.DATE(3), allowNull: true },
    last_error: { type: DataTypes.STRING(255), allowNull: true },
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('mail_queue', ['sent_at', 'failed_at', 'next_attempt_at'])
  await qi.addIndex('mail_queue', ['to_address', 'kind', 'created_at'])
  await qi.addIndex('mail_queue', ['sender_address', 'created_at'])
  await qi.addIndex('mail_queue', ['sender_user_id', 'created_at'])
  await qi.addIndex('mail_queue', ['studio_id', 'created_at'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('mail_queue')
  await qi.dropTable('email_confirmations')
  await qi.removeColumn('users', 'email_confirmed_at')
  await qi.dropTable('user_sessions')
}
