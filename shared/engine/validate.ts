// Small input checks shared by the engine's files. Each throws a
// KnittingInputError naming the field, so the API can answer 400 with a
// message a person can act on. Not part of the public API.

import { KnittingInputError } from './errors'

function show(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value)
  if (typeof value === 'number' || typeof value === 'boolean' || value == null) return String(value)
  return Array.isArray(value) ? 'a list' : `a ${typeof value}`
}

/** A whole number in [min, max]. */
export function requireInteger(value: unknown, field: string, min: number, max = Number.MAX_SAFE_INTEGER): number {
  if (typeof value !== 'number' || !Number.isInteger(value)) {
    throw new KnittingInputError(`${field}: expected a whole number, got ${show(value)}`, { field })
  }
  if (value < min) {
    throw new KnittingInputError(`${field}: must be at least ${min}, got ${value}`, { field })
  }
  if (value > max) {
    throw new KnittingInputError(`${field}: must be at most ${max}, got ${value}`, { field })
  }
  return value
}

/** A finite number greater than zero. */
export function requirePositive(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new KnittingInputError(`${field}: expected a number, got ${show(value)}`, { field })
  }
  if (value <= 0) {
    throw new KnittingInputError(`${field}: must be greater than 0, got ${value}`, { field })
  }
  return value
}

/** A finite number of zero or more. */
export function requireNonNegative(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new KnittingInputError(`${field}: expected a number, got ${show(value)}`, { field })
  }
  if (value < 0) {
    throw new KnittingInputError(`${field}: must not be negative, got ${value}`, { field })
  }
  return value
}

/** A non-empty string (after trimming). */
export function requireName(value: unknown, field: string): string {
  if (typeof value !== 'string' || value.trim() === '') {
    throw new KnittingInputError(`${field}: expected a yarn name, got ${show(value)}`, { field })
  }
  return value
}

export function requireObject(value: unknown, field: string): Record<string, unknown> {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) {
    throw new KnittingInputError(`${field}: expected an object, got ${show(value)}`, { field })
  }
  return value as Record<string, unknown>
}
