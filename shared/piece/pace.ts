// A finish estimate from the knitter's own recent pace: the median time per row over the
// last steps, leaving out pauses (a break, a yarn tangle) so one tea break does not
// double the estimate.

export interface PaceStep { at: string | number; rows: number }

const pauseMs = 5 * 60_000

/** Milliseconds per row from recent forward steps (oldest first), or null with too little to go on. */
export function msPerRow(steps: PaceStep[], lookBack = 30): number | null {
  const recent = steps.slice(-lookBack - 1)
  const perRow: number[] = []
  for (let i = 1; i < recent.length; i++) {
    const dt = new Date(recent[i]!.at).getTime() - new Date(recent[i - 1]!.at).getTime()
    const rows = recent[i]!.rows
    if (rows > 0 && dt > 0 && dt < pauseMs) perRow.push(dt / rows)
  }
  if (perRow.length < 3) return null
  perRow.sort((a, b) => a - b)
  const mid = perRow.length >> 1
  return perRow.length % 2 ? perRow[mid]! : (perRow[mid - 1]! + perRow[mid]!) / 2
}

/** "about 1 h 40 min", "about 12 min", "under a minute". */
export function describeDuration(ms: number): string {
  const minutes = Math.round(ms / 60_000)
  if (minutes < 1) return 'under a minute'
  if (minutes < 60) return `about ${minutes} min`
  const h = Math.floor(minutes / 60), m = minutes % 60
  return m ? `about ${h} h ${m} min` : `about ${h} h`
}
