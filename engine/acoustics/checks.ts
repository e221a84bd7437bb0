// Argument checks shared by the acoustics layer. They throw RangeError so a
// caller (scenario validation, CLI, app) can tell bad input from a bug.

export function requirePositive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new RangeError(`${name} must be a positive finite number (got ${value})`);
  }
}

export function requireNonNegative(name: string, value: number): void {
  if (!(Number.isFinite(value) && value >= 0)) {
    throw new RangeError(`${name} must be a non-negative finite number (got ${value})`);
  }
}

export function requireCount(name: string, value: number, min: number): void {
  if (!(Number.isInteger(value) && value >= min)) {
    throw new RangeError(`${name} must be an integer >= ${min} (got ${value})`);
  }
}
