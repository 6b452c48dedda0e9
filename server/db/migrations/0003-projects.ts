import { DataTypes, type QueryInterface } from 'sequelize'

// Projects and their pieces, and the append-only log of row events that moved them.
export async function up({ context: qi }: { context: QueryInterface }) {
  const now = { type: DataTypes.DATE(3), allowNull: false }
  const when = { type: DataTypes.DATE(3), allowNull: true }
  await qi.createTable('projects', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' },
    knitter_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    status: { type: DataTypes.ENUM('planned', 'knitting', 'finished'), allowNull: false, defaultValue: 'planned' },
    // The timeline input of every piece as it was when the project was made.
    plan_snapshot: { type: DataTypes.JSON, allowNull: false },
    machine_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'machines', key: 'id' }, onDelete: 'SET NULL' },
    motif_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'motifs', key: 'id' }, onDelete: 'SET NULL' },
    // Slot letter → { yarnId?, name, hex }.
    yarns: { type: DataTypes.JSON, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    started_at: when,
    finished_at: when,
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('projects', ['studio_id'])
  await qi.addIndex('projects', ['knitter_id'])
  await qi.createTable('pieces', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    project_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    timeline: { type: DataTypes.JSON, allowNull: false },
    total_rows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    completed_rows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
    last_device_id: { type: DataTypes.STRING(64), allowNull: true },
    last_knitted_at: when,
    finished_at: when,
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('pieces', ['project_id', 'position'])
  await qi.createTable('row_events', {
    // Made on the device; the primary key is what makes a replayed event a no-op.
    id: { type: DataTypes.CHAR(36), primaryKey: true },
    // Arrival order, so "this device's latest event" is exact even within one millisecond.
    seq: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, unique: true, allowNull: false },
    piece_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'pieces', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    device_id: { type: DataTypes.STRING(64), allowNull: false },
    kind: { type: DataTypes.ENUM('advance', 'back', 'jump'), allowNull: false },
    from_rows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    to_rows: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    at: { type: DataTypes.DATE(3), allowNull: false },
    received_at: { type: DataTypes.DATE(3), allowNull: false },
    outcome: { type: DataTypes.ENUM('applied', 'conflict', 'rejected'), allowNull: false },
  })
  await qi.addIndex('row_events', ['piece_id', 'received_at'])
  // "This device's latest event on the piece" is read for every event synced: keep it an index lookup.
  await qi.addIndex('row_events', ['piece_id', 'device_id', 'seq'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['row_events', 'pieces', 'projects']) await qi.dropTable(t)
}
