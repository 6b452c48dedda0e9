// A trivial route: readiness for the start script and the baseline for benchmarks.
export default defineEventHandler(() => ({ ok: true }))
