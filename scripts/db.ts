// Database chores run by the set-up scripts with jiti: `migrate`, `seed`.
import { createSequelize } from '../server/db/connection'
import { createMigrator } from '../server/db/migrator'
import { initModels } from '../server/db/models'
import { seedDemo } from '../server/db/seeds/demo'

const command = process.argv[2]
const sequelize = createSequelize(process.env.DATABASE_URL ?? '')
initModels(sequelize)

try {
  if (command === 'migrate') {
    const done = await createMigrator(sequelize).up()
    console.log(`[floatwise] Migrations: ${done.length ? done.map(m => m.name).join(', ') : 'up to date'}`)
  }
  else if (command === 'seed') {
    const result = await seedDemo(sequelize)
    console.log(`[floatwise] Demo studio: ${result === 'created' ? 'added' : 'already there (unchanged)'}`)
  }
  else {
    throw new Error(`unknown command "${command}" (expected migrate or seed)`)
  }
}
finally {
  await sequelize.close()
}
