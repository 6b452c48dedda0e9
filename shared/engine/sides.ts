// Sides seen at the machine. The engine names every side (carriage, edges, the parts of a neck)
// as the piece is drawn, from the knit side. At a single-bed machine the knitter faces the purl
// side (common practice: the knit side faces away, towards the sinker posts), so what the engine
// calls left is on the knitter's right. Every word shown at the machine, and the carriage side
// a plan states, goes through this one swap.

import type { Side } from './shapePiece'

/** The side as the knitter facing the bed sees it, for a side seen from the knit side (and back). */
export const atMachine = (side: Side): Side => (side === 'left' ? 'right' : 'left')
