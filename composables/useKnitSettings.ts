/** The knitter's choices for the knit view, kept on this device. */
export function useKnitSettings() {
  return {
    /** Rows per tap: a row pair (2) by default, or one row. */
    step: useLocalStorage<1 | 2>('fw-knit-step', 2),
    /** How many rows before a colour change the bell rings (default: the last row pair). */
    ahead: useLocalStorage<number>('fw-knit-ahead', 2),
    sound: useLocalStorage<boolean>('fw-knit-sound', true),
    voice: useLocalStorage<boolean>('fw-knit-voice', false),
  }
}
