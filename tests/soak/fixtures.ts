import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Sequelize } from 'sequelize'
import { Membership, Piece, Studio, User } from '../../server/db/models'
import { insertProject } from '../../server/db/projects'
import { borderedMotifTimeline, slotYarns } from '#shared/piece/timeline'

// The soak's studio: knitters with two tablets each. Every tablet knits a piece of its own;
// every `sharedEvery`-th knitter also has a piece both tablets knit (conflicts on purpose).

export const soakPassword = 'soak-password-123'

export interface SoakKnitter { email: string; ownPieces: [number, number]; sharedPiece: number | null }

export async function makeSoakStudio(db: Sequelize, options: { knitters: number; sharedEvery: number; chartRows: number }): Promise<SoakKnitter[]> {
  const passwordHash = await new Hash(new Scrypt({})).make(soakPassword)
  const studio = await Studio.create({ name: 'Soak studio' })
  const yarns = slotYarns([{ name: 'Soak oat', hex: '#e8dcc0' }, { name: 'Soak navy', hex: '#1c2a4a' }])
  const timeline = borderedMotifTimeline({
    technique: 'together', needles: 60, yarns, motif: { name: 'Soak zigzag', chart: ['x..', '.x.', '..x', '.x.'] },
    chartRows: options.chartRows, borderBefore: 0, borderAfter: 0,
  })
  const run = Date.now().toString(36)
  const knitters: SoakKnitter[] = []
  for (let k = 0; k < options.knitters; k++) {
    const shared = k % options.sharedEvery === 0
    const user = await User.create({ email: `soak-${run}-${k}@example.test`, name: `Soak knitter ${k}`, passwordHash, emailConfirmedAt: new Date() })
    await Membership.create({ studioId: studio.id, userId: user.id, role: 'knitter' })
    const project = await db.transaction(t => insertProject({
      studioId: studio.id, knitterId: user.id, name: `Soak project ${k}`, yarns: yarns.map(y => ({ ...y, yarnId: null })),
      source: 'fixture', motifName: 'Soak zigzag',
      pieces: ['Left tablet', 'Right tablet', ...(shared ? ['Shared'] : [])].map(name => ({ name, timeline })),
    }, t))
    const ids = (await Piece.findAll({ where: { projectId: project.id }, order: [['position', 'ASC']], attributes: ['id'] })).map(p => p.id)
    knitters.push({ email: user.email, ownPieces: [ids[0]!, ids[1]!], sharedPiece: ids[2] ?? null })
  }
  return knitters
}
