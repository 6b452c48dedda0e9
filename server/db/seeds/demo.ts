import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Sequelize } from 'sequelize'
import { analyseFloats, chartFromRows } from '../../../shared/knitting'
import type { MotifFloatReport } from '../../../shared/types/motif'
import { Machine, Membership, Motif, Studio, User, Yarn } from '../models'

// Invented demo data: a small studio on a salt marsh. Nothing here is real.
export const demoPassword = 'floatwise-demo'
export const demoAccounts = [
  { email: 'owner@floatwise.test', name: 'Maren Holt', role: 'owner' },
  { email: 'designer@floatwise.test', name: 'Idris Vale', role: 'designer' },
  { email: 'knitter@floatwise.test', name: 'Tamsin Roe', role: 'knitter' },
] as const
export const demoStudioName = 'Saltmarsh Knitwear'

const machines = [
  { name: 'Workroom standard bed', needlePitchMm: 4.5, needles: 200, patterningWidth: 24, technique: 'together' as const, passesPerColour: 2, notes: 'Standard gauge; patterning 24 stitches wide.' },
  { name: 'Window mid-gauge bed', needlePitchMm: 6.5, needles: 150, patterningWidth: 12, technique: 'colour-by-colour' as const, passesPerColour: 2, notes: 'Mid gauge; the colour changer sits on the left.' },
]

const yarns = [
  { name: 'Cream', hex: '#efe6d2', weightCategory: 1, metresPer100g: 400, gramsOnHand: 600 },
  { name: 'Ink blue', hex: '#1d2f5a', weightCategory: 1, metresPer100g: 400, gramsOnHand: 450 },
  { name: 'Charcoal', hex: '#33383b', weightCategory: 1, metresPer100g: 400, gramsOnHand: 300 },
  { name: 'Mustard', hex: '#c99a2e', weightCategory: 1, metresPer100g: 400, gramsOnHand: 150 },
  { name: 'Heather pink', hex: '#c58fa9', weightCategory: 2, metresPer100g: 320, gramsOnHand: 200 },
  { name: 'Slate', hex: '#6d7f8c', weightCategory: 2, metresPer100g: 320, gramsOnHand: 250 },
  { name: 'Moss', hex: '#5c6b2e', weightCategory: 3, metresPer100g: 220, gramsOnHand: 400 },
  { name: 'Rust', hex: '#a4471f', weightCategory: 3, metresPer100g: 220, gramsOnHand: 350 },
]

// Rows are listed first-knitted first. Three float lengths: tidy, moderate and long.
export const demoMotifs = [
  { name: 'Pebble check', published: true, rows: ['x...', '..x.', 'x...', '..x.'] },
  { name: 'Marsh wave', published: true, rows: ['xx....', '.xx...', '..xx..', '...xx.', '....xx', 'x....x'] },
  {
    name: 'Lantern medallion', published: true,
    rows: ['............', '.....xx.....', '....xxxx....', '...xx..xx...', '..xx....xx..', '...xx..xx...', '....xxxx....', '.....xx.....'],
  },
  { name: 'Heron steps (draft)', published: false, rows: ['xxx...', '.xxx..', '..xxx.', '...xxx', 'x...xx', 'xx...x'] },
]

/** Motif cells as stored ('0'/'1' per cell) with the float report for its own width. */
export function motifRecord(rows: string[]) {
  const chart = chartFromRows(rows)
  const report = analyseFloats(chart, { needles: chart.width * 4 })
  return {
    width: chart.width,
    height: chart.height,
    cells: Array.from(chart.cells).join(''),
    floatReport: { maxFloat: report.maxFloat, verdict: report.verdict, longRows: report.longRows, unusedRows: report.unusedRows } satisfies MotifFloatReport,
  }
}

/** Adds the demo studio once; a second run finds the owner and changes nothing. */
export async function seedDemo(sequelize: Sequelize): Promise<'created' | 'present'> {
  if (await User.findOne({ where: { email: demoAccounts[0].email } })) return 'present'
  const passwordHash = await new Hash(new Scrypt({})).make(demoPassword)
  await sequelize.transaction(async (transaction) => {
    const studio = await Studio.create({ name: demoStudioName }, { transaction })
    const people: Record<string, User> = {}
    for (const account of demoAccounts) {
      const user = await User.create({ email: account.email, name: account.name, passwordHash }, { transaction })
      await Membership.create({ studioId: studio.id, userId: user.id, role: account.role }, { transaction })
      people[account.role] = user
    }
    for (const m of machines) await Machine.create({ studioId: studio.id, ...m }, { transaction })
    for (const y of yarns) await Yarn.create({ studioId: studio.id, notes: '', ...y }, { transaction })
    for (const m of demoMotifs) {
      const designer = people.designer!.id
      await Motif.create({ studioId: studio.id, name: m.name, published: m.published, createdBy: designer, updatedBy: designer, ...motifRecord(m.rows) }, { transaction })
    }
  })
  return 'created'
}
