import type { Sequelize } from 'sequelize'
import { createSequelize } from '../db/connection'
import { initModels } from '../db/models'

let instance: Sequelize | undefined

/** The server's one Sequelize instance, bound to DATABASE_URL and closed on Nitro's close hook. */
export function useDb(): Sequelize {
  if (!instance) {
    instance = createSequelize(process.env.DATABASE_URL ?? '')
    initModels(instance)
  }
  return instance
}

export async function closeDb() {
  const db = instance
  instance = undefined
  await db?.close()
}
