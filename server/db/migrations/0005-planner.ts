import { DataTypes, type QueryInterface } from 'sequelize'

// The planner: swatches measured on a machine, plans and their pieces.
export async function up({ context: qi }: { context: QueryInterface }) {
  const now = { type: DataTypes.DATE(3), allowNull: false }
  const studio = { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'studios', key: 'id' }, onDelete: 'CASCADE' }
  const person = { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' }
  const machine = { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'machines', key: 'id' }, onDelete: 'SET NULL' }
  const yarn = { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'yarns', key: 'id' }, onDelete: 'SET NULL' }
  await qi.createTable('swatches', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: studio,
    machine_id: machine,
    stitch_size: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
    main_yarn_id: yarn,
    contrast_yarn_id: yarn,
    stitches: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    rows: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    width: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
    height: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
    unit: { type: DataTypes.ENUM('cm', 'in'), allowNull: false },
    grams: { type: DataTypes.DECIMAL(8, 2), allowNull: true },
    washed: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('swatches', ['studio_id'])
  await qi.createTable('plans', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    studio_id: studio,
    name: { type: DataTypes.STRING(120), allowNull: false },
    machine_id: machine,
    swatch_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'swatches', key: 'id' }, onDelete: 'SET NULL' },
    // [{ slot, yarnId }], slot 'A' the main colour.
    yarns: { type: DataTypes.JSON, allowNull: false },
    float_limit: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 5 },
    published: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    created_by: person,
    updated_by: person,
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('plans', ['studio_id', 'name'])
  await qi.createTable('plan_pieces', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    plan_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, references: { model: 'plans', key: 'id' }, onDelete: 'CASCADE' },
    name: { type: DataTypes.STRING(120), allowNull: false },
    position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
    copies: { type: DataTypes.TINYINT.UNSIGNED, allowNull: false, defaultValue: 1 },
    target_width: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
    target_length: { type: DataTypes.DECIMAL(7, 2), allowNull: false },
    unit: { type: DataTypes.ENUM('cm', 'in'), allowNull: false },
    ease: { type: DataTypes.DECIMAL(6, 2), allowNull: false, defaultValue: 0 },
    sections: { type: DataTypes.JSON, allowNull: false },
    created_at: now,
    updated_at: now,
  })
  await qi.addIndex('plan_pieces', ['plan_id', 'position'])
}

export async function down({ context: qi }: { context: QueryInterface }) {
  for (const t of ['plan_pieces', 'plans', 'swatches']) await qi.dropTable(t)
}
