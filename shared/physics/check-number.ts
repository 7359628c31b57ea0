/**
 * Argument checks shared by the physics, simulator and plan modules. Each throws an error that
 * names the function and the argument, so a caller sees at once which input was wrong.
 */

/** Throws unless `value` is a finite number; `where` is "function: argument". */
export function requireFinite(value: number, where: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new Error(`${where} must be a finite number (got ${String(value)})`);
  }
  return value;
}

/** Throws unless `value` is a finite number greater than zero. */
export function requirePositive(value: number, where: string): number {
  if (requireFinite(value, where) <= 0) {
    throw new Error(`${where} must be greater than 0 (got ${value})`);
  }
  return value;
}

/** Throws unless `value` is a finite number of at least zero. */
export function requireNonNegative(value: number, where: string): number {
  if (requireFinite(value, where) < 0) {
    throw new Error(`${where} must be 0 or more (got ${value})`);
  }
  return value;
}

/** Throws unless `value` is an integer of at least `min`. */
export function requireInteger(value: number, where: string, min = 1): number {
  if (!Number.isInteger(value) || value < min) {
    throw new Error(`${where} must be an integer of at least ${min} (got ${String(value)})`);
  }
  return value;
}
