// Ranges of validity of the closed-form line models: each check names the quantity, the range,
// its source, and whether the given input lies inside it.

export interface RangeCheck {
  /** The quantity checked, e.g. "W/h". */
  quantity: string;
  value: number;
  min: number;
  max: number;
  /** Who states the range and what holds inside it. */
  source: string;
  inside: boolean;
}

export interface Validity {
  /** True when every check passes. */
  inside: boolean;
  checks: RangeCheck[];
  /** One line per failed check, naming the range (for the CLI and the scenario loader). */
  warnings: string[];
}

export function rangeCheck(quantity: string, value: number, min: number, max: number, source: string): RangeCheck {
  return { quantity, value, min, max, source, inside: value >= min && value <= max };
}

export function validity(model: string, checks: RangeCheck[]): Validity {
  const warnings = checks
    .filter((c) => !c.inside)
    .map((c) => `${model}: ${c.quantity} = ${fmt(c.value)} is outside ${describe(c)} (${c.source})`);
  return { inside: warnings.length === 0, checks, warnings };
}

function describe(c: RangeCheck): string {
  if (c.min === -Infinity) return `${c.quantity} ≤ ${fmt(c.max)}`;
  if (c.max === Infinity) return `${c.quantity} ≥ ${fmt(c.min)}`;
  return `${fmt(c.min)} ≤ ${c.quantity} ≤ ${fmt(c.max)}`;
}

function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  return a !== 0 && (a < 1e-3 || a >= 1e6) ? v.toExponential(3) : String(Number(v.toPrecision(4)));
}
