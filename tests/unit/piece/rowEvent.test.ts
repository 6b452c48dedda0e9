import { describe, expect, it } from 'vitest'
import { applyRowEvent } from '#shared/piece/rowEvent'

// The sync rule, worked by hand: a piece at row 10 after 4 events (version 4).
const at10 = { completedRows: 10, version: 4 }

describe('applyRowEvent', () => {
  it.each([
    ['a step from the piece\'s place on its version', { kind: 'advance', from: 10, to: 12, version: 4 }, false, 'applied', { completedRows: 12, version: 5 }],
    ['a step back from the place', { kind: 'back', from: 10, to: 8, version: 4 }, false, 'applied', { completedRows: 8, version: 5 }],
    ['a step on an older version', { kind: 'advance', from: 8, to: 10, version: 3 }, false, 'conflict', at10],
    ['a step on the version from another row', { kind: 'advance', from: 12, to: 14, version: 4 }, false, 'conflict', at10],
    ['a jump from anywhere on the version', { kind: 'jump', from: 30, to: 2, version: 4 }, false, 'applied', { completedRows: 2, version: 5 }],
    ['a jump on an older version', { kind: 'jump', from: 10, to: 2, version: 2 }, false, 'conflict', at10],
    ['a step while the device is in conflict', { kind: 'advance', from: 10, to: 12, version: 4 }, true, 'conflict', at10],
    ['a jump while the device is in conflict', { kind: 'jump', from: 14, to: 10, version: 4 }, true, 'applied', { completedRows: 10, version: 5 }],
  ] as const)('%s', (_, event, inConflict, outcome, place) => {
    expect(applyRowEvent(at10, event, inConflict)).toEqual({ outcome, place })
  })
})
