import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Sequelize, Transaction } from 'sequelize'
import { borderedMotifTimeline, slotYarns } from '#shared/piece/timeline'
import type { PieceShape, PlanPieceInput } from '#shared/types/plan'
import { Machine, Membership, Motif, Piece, Plan, PlanPiece, Project, RowEvent, Studio, Swatch, User, Yarn } from '../models'
import { motifRecord } from '../motifs'
import { insertProject } from '../projects'

// Invented demo data: a small studio on a salt marsh. Nothing here is real.
export const demoPassword = 'floatwise-demo'
export const demoAccounts = [
  { email: 'owner@floatwise.test', name: 'Maren Holt', role: 'owner' },
  { email: 'designer@floatwise.test', name: 'Idris Vale', role: 'designer' },
  { email: 'knitter@floatwise.test', name: 'Tamsin Roe', role: 'knitter' },
] as const
export const demoStudioName = 'Saltmarsh Knitwear'

const machines = [
  {
    name: 'Workroom standard bed',
    needlePitchMm: 4.5,
    needles: 200,
    patterningWidth: 24,
    technique: 'together' as const,
    passesPerColour: 2,
    notes: 'Standard gauge; patterning 24 stitches wide.',
  },
  {
    name: 'Window mid-gauge bed',
    needlePitchMm: 6.5,
    needles: 150,
    patterningWidth: 12,
    technique: 'colour-by-colour' as const,
    passesPerColour: 2,
    notes: 'Mid gauge; the colour changer sits on the left.',
  },
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
  { name: 'Heron steps', published: false, rows: ['xxx...', '.xxx..', '..xxx.', '...xxx', 'x...xx', 'xx...x'] },
]

/** Adds the demo studio once; a second run finds the owner and changes nothing. */
export async function seedDemo(sequelize: Sequelize): Promise<'created' | 'present'> {
  if (await User.findOne({ where: { email: demoAccounts[0].email } })) return 'present'
  const passwordHash = await new Hash(new Scrypt({})).make(demoPassword)
  await sequelize.transaction(async (transaction) => {
    const studio = await Studio.create({ name: demoStudioName }, { transaction })
    const people: Record<string, User> = {}
    for (const account of demoAccounts) {
      const user = await User.create({ email: account.email, name: account.name, passwordHash, emailConfirmedAt: new Date() }, { transaction })
      await Membership.create({ studioId: studio.id, userId: user.id, role: account.role }, { transaction })
      people[account.role] = user
    }
    const machineRows: Machine[] = []
    for (const m of machines) machineRows.push(await Machine.create({ studioId: studio.id, ...m }, { transaction }))
    const yarnRows: Record<string, Yarn> = {}
    for (const y of yarns) yarnRows[y.name] = await Yarn.create({ studioId: studio.id, notes: '', ...y }, { transaction })
    const motifRows: Record<string, Motif> = {}
    for (const m of demoMotifs) {
      const designer = people.designer!.id
      motifRows[m.name] = await Motif.create(
        { studioId: studio.id, name: m.name, published: m.published, createdBy: designer, updatedBy: designer, ...motifRecord(m.rows) },
        { transaction },
      )
    }
    const stock = { studio, knitter: people.knitter!, machines: machineRows, yarns: yarnRows, motifs: motifRows }
    await seedProjects(stock, transaction)
    await seedPlans(stock, people.designer!, transaction)
  })
  return 'created'
}

interface DemoStock { studio: Studio; knitter: User; machines: Machine[]; yarns: Record<string, Yarn>; motifs: Record<string, Motif> }

/** A timeline of the demo motif `motif` in the two named yarns (main first). */
function demoTimeline(
  stock: DemoStock,
  motif: string,
  yarnNames: [string, string],
  shape: {
    technique: 'together' | 'colour-by-colour'
    needles: number
    chartRows: number
    before: number
    after: number
    labels: { before: string; after: string }
  },
) {
  const chosen = yarnNames.map(n => stock.yarns[n]!)
  const slots = slotYarns(chosen)
  return {
    yarns: slots.map((y, i) => ({ ...y, yarnId: chosen[i]!.id })),
    timeline: borderedMotifTimeline({
      technique: shape.technique,
      passesPerColour: 2,
      needles: shape.needles,
      yarns: slots,
      motif: { name: motif, chart: demoMotifs.find(m => m.name === motif)!.rows },
      chartRows: shape.chartRows,
      borderBefore: shape.before,
      borderAfter: shape.after,
      labels: shape.labels,
    }),
  }
}

/** The knitter's place on a piece, as a tablet would have left it (with its row event in the log). */
async function demoPlace(piece: Piece, completedRows: number, at: Date, eventId: string, transaction: Transaction) {
  await RowEvent.create({
    id: eventId, pieceId: piece.id, userId: (await Project.findByPk(piece.projectId, { transaction }))!.knitterId, deviceId: 'demo-workroom-tablet',
    kind: 'jump', fromRows: 0, toRows: completedRows, version: 0, at, receivedAt: at, outcome: 'applied',
  }, { transaction })
  await piece.update({
    completedRows, version: 1, lastDeviceId: 'demo-workroom-tablet', lastKnittedAt: at,
    finishedAt: completedRows >= piece.totalRows ? at : null,
  }, { transaction })
}

/**
 * A knitting session on a piece: `pairs` steps of one row pair, about a minute and a half apart
 * and ending at `end`, as the tablet would have logged them (the studio's pace comes from these).
 */
async function demoSession(piece: Piece, pairs: number, end: Date, transaction: Transaction) {
  const userId = (await Project.findByPk(piece.projectId, { transaction }))!.knitterId
  let { completedRows: rows, version } = piece
  for (let i = 0; i < pairs; i++) {
    const at = new Date(end.getTime() - (pairs - 1 - i) * 90_000 + (i % 3) * 7_000)
    await RowEvent.create({
      id: `6a3e1c52-4d7b-4f0e-9a61-0d5c2b7e9${String(i).padStart(3, '0')}`, pieceId: piece.id, userId, deviceId: 'demo-workroom-tablet',
      kind: 'advance', fromRows: rows, toRows: rows + 2, version, at, receivedAt: at, outcome: 'applied',
    }, { transaction })
    rows += 2
    version += 1
  }
  await piece.update({ completedRows: rows, version, lastKnittedAt: end }, { transaction })
}

/** A jumper in progress (back done, front mid-motif, sleeves to come) and a small cushion not yet started. */
async function seedProjects(stock: DemoStock, transaction: Transaction) {
  const jumper = demoTimeline(stock, 'Marsh wave', ['Cream', 'Ink blue'], {
    technique: 'together', needles: 120, chartRows: 96, before: 20, after: 10, labels: { before: 'Welt', after: 'Shoulder band' },
  })
  const project = await insertProject({
    studioId: stock.studio.id, knitterId: stock.knitter.id, name: 'Marsh wave jumper', machineId: stock.machines[0]!.id,
    motifId: stock.motifs['Marsh wave']!.id, motifName: 'Marsh wave', yarns: jumper.yarns, source: 'demo',
    notes: 'Cream body, ink blue waves. Sleeves are knitted twice from the same timeline.',
    pieces: ['Back', 'Front', 'Sleeve', 'Sleeve'].map(name => ({ name, timeline: jumper.timeline })),
  }, transaction)
  const [back, front] = await Piece.findAll({ where: { projectId: project.id }, order: [['position', 'ASC']], transaction })
  const dayAgo = new Date(Date.now() - 24 * 3600_000)
  await demoPlace(back!, back!.totalRows, new Date(dayAgo.getTime() - 2 * 24 * 3600_000), '6a3e1c52-4d7b-4f0e-9a61-0d5c2b7e8f01', transaction)
  await demoPlace(front!, 23, new Date(dayAgo.getTime() - 20 * 60_000), '6a3e1c52-4d7b-4f0e-9a61-0d5c2b7e8f02', transaction)
  await demoSession(front!, 12, dayAgo, transaction)
  await project.update({ status: 'knitting', startedAt: new Date(dayAgo.getTime() - 3 * 24 * 3600_000) }, { transaction })

  const cushion = demoTimeline(stock, 'Lantern medallion', ['Moss', 'Cream'], {
    technique: 'colour-by-colour', needles: 96, chartRows: 16, before: 8, after: 8, labels: { before: 'Lower border', after: 'Upper border' },
  })
  await insertProject({
    studioId: stock.studio.id, knitterId: stock.knitter.id, name: 'Lantern cushion', machineId: stock.machines[1]!.id,
    motifId: stock.motifs['Lantern medallion']!.id, motifName: 'Lantern medallion', yarns: cushion.yarns, source: 'demo',
    notes: 'Mid-gauge bed, colour by colour, two passes per colour.',
    pieces: [{ name: 'Cushion front', timeline: cushion.timeline }],
  }, transaction)
}

/**
 * A weighed swatch and two plans from it: a published jumper (back, front, two sleeves with
 * increases) that knitters can start, and a draft scarf the designer is still working on.
 */
async function seedPlans(stock: DemoStock, designer: User, transaction: Transaction) {
  const [standard] = stock.machines
  const cream = stock.yarns.Cream!, ink = stock.yarns['Ink blue']!
  const swatch = await Swatch.create({
    studioId: stock.studio.id, machineId: standard!.id, stitchSize: '6', mainYarnId: cream.id, contrastYarnId: ink.id,
    stitches: 40, rows: 60, width: 13.3, height: 14.2, unit: 'cm', grams: 6.8, washed: true,
    notes: 'Marsh wave over the middle 24 stitches; washed and dried flat before measuring.',
  }, { transaction })
  const wave = stock.motifs['Marsh wave']!.id
  // Four sizes, measured flat on the finished piece (invented for the demo). The chest carries
  // 2 cm of ease over the table's figure; the back's neck is the stitches its shoulders leave.
  const bodyShape = (neck: PieceShape['neck']): PieceShape => ({
    kind: 'body', carriageStart: 'right', armhole: true, shoulder: 'cast-off', neck, cap: false,
    measurements: {
      hemWidth: [42, 47, 52, 57], width: [44, 49, 54, 59], lengthToUnderarm: [38, 39, 40, 41],
      armholeCastOff: [2.5, 3, 3, 3.5], armholeDecrease: [1.5, 2, 2.5, 3], armholeDepth: [19, 20, 21, 22],
      shoulderWidth: [10, 11, 12, 13], shoulderDrop: [1.5, 1.5, 2, 2],
      ...(neck ? { neckWidth: [16, 17, 17, 18], neckDepth: [8, 8, 8.5, 8.5] } : {}),
    },
    ease: { width: 2 },
  })
  const body = (name: string, neck: PieceShape['neck']): PlanPieceInput => ({
    name, copies: 1, targetWidth: 42, targetLength: 57, unit: 'cm', ease: 0, shape: bodyShape(neck),
    sections: [
      { kind: 'cast-on-note', text: 'Cast on with waste yarn, then a row of cream.' },
      { kind: 'plain', label: 'Welt', rows: 30, yarn: 'A', stitchSize: '4' },
      { kind: 'setting-note', text: 'Stitch size back to 6.' },
      { kind: 'motif', motifId: wave, placement: 'centred', lengthCm: 44, main: 'A', contrast: 'B' },
      { kind: 'cast-off-note', text: 'Cast off loosely over the gate pegs.' },
    ],
  })
  const sleeve: PlanPieceInput = {
    name: 'Sleeve', copies: 2, targetWidth: 20, targetLength: 56, unit: 'cm', ease: 0,
    shape: {
      kind: 'sleeve', carriageStart: 'right', armhole: false, shoulder: null, neck: null, cap: true,
      measurements: {
        hemWidth: [20, 21, 22, 23], width: [32, 34, 36, 38], lengthToUnderarm: [44, 45, 46, 46],
        capCastOff: [2.5, 3, 3, 3.5], capHeight: [12, 12.5, 13, 13.5], capTopWidth: [8, 8, 9, 9],
      },
      ease: {},
    },
    sections: [
      { kind: 'plain', label: 'Cuff', rows: 30, yarn: 'A', stitchSize: '4' },
      { kind: 'setting-note', text: 'Stitch size back to 6.' },
      { kind: 'plain', label: 'Lower sleeve', lengthCm: 30, yarn: 'A' },
      { kind: 'motif', motifId: wave, placement: 'centred', chartRows: 48, main: 'A', contrast: 'B' },
      { kind: 'cast-off-note', text: 'Cast off the top loosely.' },
    ],
  }
  const plans = [
    {
      name: 'Marsh wave jumper plan', published: true, sizes: ['S', 'M', 'L', 'XL'], notes: 'Cream body, ink blue waves; sleeves twice.',
      pieces: [body('Back', null), body('Front', 'round'), sleeve],
    },
    {
      name: 'Pebble check scarf (draft)', published: false, sizes: ['One size'], notes: 'Still choosing the length.',
      pieces: [{ name: 'Scarf', copies: 1, targetWidth: 25, targetLength: 150, unit: 'cm' as const, ease: 0, sections: [
        { kind: 'motif' as const, motifId: stock.motifs['Pebble check']!.id, placement: 'centred' as const, lengthCm: 150, main: 'A', contrast: 'B' },
      ] }],
    },
  ]
  for (const p of plans) {
    const plan = await Plan.create({
      studioId: stock.studio.id, name: p.name, machineId: standard!.id, swatchId: swatch.id, floatLimit: 5, published: p.published,
      sizes: p.sizes, notes: p.notes,
      yarns: [{ slot: 'A', yarnId: cream.id }, { slot: 'B', yarnId: ink.id }], createdBy: designer.id, updatedBy: designer.id,
    }, { transaction })
    for (const [i, piece] of p.pieces.entries()) await PlanPiece.create({ planId: plan.id, position: i + 1, ...piece }, { transaction })
  }
}
