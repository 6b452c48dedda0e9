// The knitter's pace on each piece (for the finish estimate), kept in localStorage per piece.
// It is the person's own, so it goes when they leave the device.
const pacePrefix = 'fw-pace-'

export function knitPaceKey(pieceId: number): string {
  return `${pacePrefix}${pieceId}`
}

export function forgetKnitPace(): void {
  const keys = Array.from({ length: localStorage.length }, (_, i) => localStorage.key(i) ?? '')
  for (const key of keys) if (key.startsWith(pacePrefix)) localStorage.removeItem(key)
}
