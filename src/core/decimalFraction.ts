/** A non-negative rational number p/q as two BigInts (q > 0, not necessarily in lowest terms). */
export interface DecimalFraction {
  readonly numerator: bigint;
  readonly denominator: bigint;
}

/**
 * The decimal number a double prints as, as an exact fraction: the shortest decimal string that reads back as
 * the same double (JavaScript's `String(x)`), turned into p/10^e with BigInt.
 *
 * **Method.** `String(x)` gives the shortest round-trip decimal (ECMAScript Number::toString); its digits and
 * exponent give p and q = 10^e exactly. A user who types Γ = 1.05 means 105/100, not the double nearest to it
 * (1.0500000000000000444…), so a comparison of (1 + Γ)·k with Γ·N made with this fraction decides exactly
 * the equality the user had in mind.
 *
 * **References.** ECMAScript Language Specification, Number::toString (shortest round-trip digits);
 * Steele GL, White JL (1990) How to print floating-point numbers accurately. PLDI '90:112–126.
 *
 * **Special cases.** Negative, NaN or infinite x → null. 0 → 0/1.
 *
 * @param x a finite number ≥ 0
 */
export function decimalFraction(x: number): DecimalFraction | null {
  if (!(x >= 0) || !Number.isFinite(x)) return null;
  const text = String(x);
  const match = /^(\d+)(?:\.(\d+))?(?:e([+-]\d+))?$/.exec(text);
  if (!match) return null;
  const digits = (match[1] + (match[2] ?? '')).replace(/^0+(?=\d)/, '');
  const exponent = Number(match[3] ?? 0) - (match[2]?.length ?? 0);
  const numerator = BigInt(digits) * (exponent > 0 ? 10n ** BigInt(exponent) : 1n);
  const denominator = exponent < 0 ? 10n ** BigInt(-exponent) : 1n;
  return Object.freeze({ numerator, denominator });
}
