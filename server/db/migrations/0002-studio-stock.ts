import { DataTypes, type QueryInterface } from 'sequelize'

// What a studio owns: machines, yarn stock and motifs.
export async function up({ context: qi }: { context: QueryInterface }) {
  const now = { type: DataTypes.DATE(3), allowNull: false }
  const studio = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' }
  const person = { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' }
  await qi.createTable('machines', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: studio,
    name: { type: DataTypes.STRING(120), allowNull: false },
    needle_pitch_mm: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
    needles: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    patterning_width: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    technique: { type: DataTypes.ENUM('together', 'colour-by-colour'), allowNull: false, defaultValue: 'together' },
    passes_per_colour: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 2 },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('yarns', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: studio,
    name: { type: DataTypes.STRING(120), allowNull: false },
    hex: { type: DataTypes.CHAR(7), allowNull: false },
    weight_category: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false },
    metres_per_100g: { type: DataTypes.DECIMAL(7, 1), allowNull: false },
    grams_on_hand: { type: DataTypes.DECIMAL(8, 1), allowNull: false, defaultValue: 0 },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    created_at: now,
    updated_at: now,
  })
  await qi.createTable('motifs', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: studio,
    name: { type: DataTypes.STRING(120), allowNull: false },
    width: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    height: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    // One character per cell, '0' main and '1' contrast, row 0 (first knitted) first.
    cells: { type: DataTypes.TEXT('medium'), allowNull: false },
    published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    float_report: { type: DataTypes.JSON, allowNull: true },
    created_by: person,
    updated_by: person,
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('motifs', ['studio_id', 'name'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['motifs', 'yarns', 'machines']) await qi.dropTable(t)
}
