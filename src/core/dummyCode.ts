/** A column as read from a table: numbers, text, or missing cells (null, undefined, NaN or empty text). */
export interface RawColumn {
  readonly name: string;
  readonly values: readonly (number | string | null | undefined)[];
}

/** A numeric column ready for a regression design. */
export interface NumericColumn {
  readonly name: string;
  readonly values: readonly number[];
}

/** How one column was coded. */
export interface ColumnCoding {
  readonly column: string;
  /** `numeric`: copied; `categorical`: replaced by indicator columns. */
  readonly kind: 'numeric' | 'categorical';
  /** Every level seen (categorical only; empty for numeric), in character order. */
  readonly levels: readonly string[];
  /** The reference level (the first in character order), which has no indicator; null for numeric columns. */
  readonly reference: string | null;
  /** The output columns made from this column. */
  readonly outputColumns: readonly string[];
}

/** The result of {@link dummyCode}. Frozen. */
export interface DummyCoding {
  readonly columns: readonly NumericColumn[];
  readonly codings: readonly ColumnCoding[];
}

/**
 * Turns text columns, and numeric columns declared categorical, into 0/1 indicator columns, one per level
 * except the reference level; numeric columns are copied.
 *
 * **Method.** Treatment (reference-cell) coding: a categorical column with levels ℓ₀ < ℓ₁ < … < ℓ_k (sorted
 * by UTF-16 code unit, which is byte order for ASCII text — the order of R's factor levels in the C locale)
 * becomes k columns named `column=ℓⱼ` (j ≥ 1), 1 where the value is ℓⱼ and 0 otherwise; ℓ₀ is the reference.
 * A column is categorical when it is listed in `categorical` or holds any text that is not a missing cell.
 * Numbers in a categorical column are read as their JavaScript text (String(v)), so their levels are
 * ordered as text ("10" < "2"), as the text of a CSV cell would be.
 *
 * **References.** Chambers JM, Hastie TJ (eds) (1992) Statistical Models in S, Wadsworth, §2.3.2 (contrasts;
 * treatment coding) — recalled from memory.
 *
 * **Special cases.** Missing cells (null, undefined, NaN, empty or blank text) stay missing: NaN in every
 * indicator of that column, and NaN in a numeric column. A categorical column with one level yields no
 * indicator columns (it is constant).
 *
 * @param columns the columns, each with a name and values of equal length
 * @param categorical names of numeric columns to treat as categories (e.g. a region code)
 * @throws RangeError when the columns differ in length or a name in `categorical` is not a column
 */
export function dummyCode(columns: readonly RawColumn[], categorical: readonly string[] = []): DummyCoding {
  const n = columns.length > 0 ? columns[0].values.length : 0;
  for (const c of columns) if (c.values.length !== n) throw new RangeError(`column "${c.name}" has ${c.values.length} values, not ${n}`);
  for (const name of categorical) {
    if (!columns.some((c) => c.name === name)) throw new RangeError(`"${name}" is listed as categorical but is not a column`);
  }
  const out: NumericColumn[] = [];
  const codings: ColumnCoding[] = [];
  for (const column of columns) {
    const isText = column.values.some((v) => typeof v === 'string' && !isMissing(v));
    if (!isText && !categorical.includes(column.name)) {
      const values = column.values.map((v) => (isMissing(v) ? NaN : Number(v)));
      out.push(Object.freeze({ name: column.name, values: Object.freeze(values) }));
      codings.push(Object.freeze({ column: column.name, kind: 'numeric', levels: Object.freeze([]), reference: null, outputColumns: Object.freeze([column.name]) }));
      continue;
    }
    const texts = column.values.map((v) => (isMissing(v) ? null : typeof v === 'string' ? v.trim() : String(v)));
    const levels = [...new Set(texts.filter((t): t is string => t !== null))].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    const names: string[] = [];
    for (const level of levels.slice(1)) {
      const name = `${column.name}=${level}`;
      names.push(name);
      const values = texts.map((t) => (t === null ? NaN : t === level ? 1 : 0));
      out.push(Object.freeze({ name, values: Object.freeze(values) }));
    }
    codings.push(
      Object.freeze({
        column: column.name,
        kind: 'categorical',
        levels: Object.freeze(levels),
        reference: levels.length > 0 ? levels[0] : null,
        outputColumns: Object.freeze(names),
      }),
    );
  }
  return Object.freeze({ columns: Object.freeze(out), codings: Object.freeze(codings) });
}

function isMissing(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === 'number' && Number.isNaN(v)) || (typeof v === 'string' && v.trim() === '');
}
