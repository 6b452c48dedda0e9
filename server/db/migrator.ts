import { Umzug, SequelizeStorage } from 'umzug'
import type { Sequelize } from 'sequelize'
import * as m0001 from './migrations/0001-accounts'
import * as m0002 from './migrations/0002-studio-stock'
import * as m0003 from './migrations/0003-projects'
import * as m0004 from './migrations/0004-motif-library'
import * as m0005 from './migrations/0005-planner'
import * as m0006 from './migrations/0006-sessions-and-mail'
import * as m0007 from './migrations/0007-edit-versions'
import * as m0008 from './migrations/0008-sizes-and-shapes'
import * as m0009 from './migrations/0009-machine-cards'

// Listed by hand (no file glob) so the bundled server and scripts find the same set.
// Append new migrations; never edit one that has shipped.
const migrations = [
  { name: '0001-accounts', ...m0001 },
  { name: '0002-studio-stock', ...m0002 },
  { name: '0003-projects', ...m0003 },
  { name: '0004-motif-library', ...m0004 },
  { name: '0005-planner', ...m0005 },
  { name: '0006-sessions-and-mail', ...m0006 },
  { name: '0007-edit-versions', ...m0007 },
  { name: '0008-sizes-and-shapes', ...m0008 },
  { name: '0009-machine-cards', ...m0009 },
]

export function createMigrator(sequelize: Sequelize) {
  return new Umzug({
    migrations,
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}
