/** Matched sets laid out flat: set s holds `values[start[s]]` (its treated unit) then its controls. */
export interface MatchedSetsLayout {
  /** Number of sets. */
  readonly sets: number;
  /** Offsets into `values`, length `sets + 1`; set s has `start[s + 1] − start[s]` units (≥ 2). */
  readonly start: Int32Array;
  /** Outcomes: per set the treated unit first, then its controls in ascending order. */
  readonly values: Float64Array;
  /** The set ids, sorted (by UTF-16 code units, as JavaScript's default sort). */
  readonly ids: readonly string[];
}

/** The rows of a matched-sets study, as given (any order). */
export interface MatchedSetsRows {
  readonly setIds: ArrayLike<string | number | null | undefined>;
  readonly treated: ArrayLike<number | null | undefined>;
  readonly outcomes: ArrayLike<number | null | undefined>;
}

/** What grouping the rows into sets found: the usable sets, and every structural fault by set id or row. */
export interface MatchedSetsGrouping {
  /** Sets with exactly one treated unit and at least one control, all with an outcome. */
  readonly layout: MatchedSetsLayout;
  readonly rows: number;
  /** Distinct set ids among rows with a set id. */
  readonly setsGiven: number;
  /** Rows whose outcome is missing (null, undefined or NaN); they are left out. */
  readonly missingOutcomes: number;
  /** Row indices (0-based) with no set id (null, undefined or empty text). */
  readonly rowsWithoutSetId: readonly number[];
  /** Row indices whose treated value is not 0 or 1. */
  readonly rowsWithBadTreated: readonly number[];
  /** Row indices whose outcome is neither missing nor a finite number (text, ±Infinity); counted in their set, without an outcome. */
  readonly rowsWithBadOutcome: readonly number[];
  /** Sets with no row marked as control. */
  readonly setsWithoutControl: readonly string[];
  /** Sets with no row marked as treated. */
  readonly setsWithoutTreated: readonly string[];
  /** Sets with more than one row marked as treated. */
  readonly setsWithSeveralTreated: readonly string[];
  /** Sets left out because the treated unit's outcome is missing. */
  readonly droppedMissingTreatedOutcome: readonly string[];
  /** Sets left out because every control's outcome is missing. */
  readonly droppedMissingControlOutcomes: readonly string[];
}

/**
 * Groups the rows of a matched-sets study (one treated unit and one or more controls per set) into sets.
 *
 * **Method.** One pass over the rows with a map from set id (as text: 1 and "1" are the same set) to its rows;
 * then the sets are sorted by id and each set holds its treated unit first and its controls in ascending order,
 * so the layout — and every sum computed from it, to the last bit — does not depend on the order of the rows. Rows with a missing outcome (null, undefined or NaN) are
 * left out and counted; a set that thereby loses its treated unit or all its controls is left out and named.
 * Rows with a bad set id or treated value are left out and named by index; a row with a bad outcome (text,
 * ±Infinity) is named and counts in its set's structure without an outcome (validation reports all of these).
 *
 * **References.** None (bookkeeping).
 *
 * **Special cases.** Sets with no control, no treated unit or several treated units are named and left out of
 * the layout; empty input → an empty layout.
 *
 * @param rows the three columns, of equal length (extra entries of a longer column are ignored)
 */
export function groupMatchedSets(rows: MatchedSetsRows): MatchedSetsGrouping {
  const count = Math.min(rows.setIds.length, rows.treated.length, rows.outcomes.length);
  const rowsWithoutSetId: number[] = [];
  const rowsWithBadTreated: number[] = [];
  const rowsWithBadOutcome: number[] = [];
  let missingOutcomes = 0;

  interface Pending {
    id: string;
    treatedRows: number;
    controlRows: number;
    treatedValue: number; // NaN when missing
    controls: number[];
  }
  const byId = new Map<string, Pending>();
  const order: Pending[] = [];
  for (let i = 0; i < count; i++) {
    const rawId = rows.setIds[i];
    if (rawId === null || rawId === undefined || (typeof rawId === 'string' && rawId.trim() === '') || (typeof rawId === 'number' && !Number.isFinite(rawId))) {
      rowsWithoutSetId.push(i);
      continue;
    }
    const t = rows.treated[i];
    if (t !== 0 && t !== 1) {
      rowsWithBadTreated.push(i);
      continue;
    }
    const y = rows.outcomes[i];
    const missing = y === null || y === undefined || (typeof y === 'number' && Number.isNaN(y));
    const bad = !missing && !(typeof y === 'number' && Number.isFinite(y));
    if (bad) rowsWithBadOutcome.push(i);
    const id = String(rawId);
    let set = byId.get(id);
    if (!set) {
      set = { id, treatedRows: 0, controlRows: 0, treatedValue: NaN, controls: [] };
      byId.set(id, set);
      order.push(set);
    }
    if (t === 1) set.treatedRows++;
    else set.controlRows++;
    if (missing || bad) {
      if (missing) missingOutcomes++;
      continue;
    }
    if (t === 1) set.treatedValue = y as number;
    else set.controls.push(y as number);
  }

  const setsWithoutControl: string[] = [];
  const setsWithoutTreated: string[] = [];
  const setsWithSeveralTreated: string[] = [];
  const droppedMissingTreatedOutcome: string[] = [];
  const droppedMissingControlOutcomes: string[] = [];
  const kept: Pending[] = [];
  let units = 0;
  order.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  for (const set of order) {
    if (set.treatedRows > 1) setsWithSeveralTreated.push(set.id);
    else if (set.treatedRows === 0) setsWithoutTreated.push(set.id);
    else if (set.controlRows === 0) setsWithoutControl.push(set.id);
    else if (Number.isNaN(set.treatedValue)) droppedMissingTreatedOutcome.push(set.id);
    else if (set.controls.length === 0) droppedMissingControlOutcomes.push(set.id);
    else {
      set.controls.sort((a, b) => a - b);
      kept.push(set);
      units += 1 + set.controls.length;
    }
  }
  const start = new Int32Array(kept.length + 1);
  const values = new Float64Array(units);
  let at = 0;
  kept.forEach((set, s) => {
    start[s] = at;
    values[at++] = set.treatedValue;
    for (const c of set.controls) values[at++] = c;
  });
  start[kept.length] = at;
  const layout: MatchedSetsLayout = Object.freeze({ sets: kept.length, start, values, ids: Object.freeze(kept.map((s) => s.id)) });
  return Object.freeze({
    layout,
    rows: count,
    setsGiven: order.length,
    missingOutcomes,
    rowsWithoutSetId: Object.freeze(rowsWithoutSetId),
    rowsWithBadTreated: Object.freeze(rowsWithBadTreated),
    rowsWithBadOutcome: Object.freeze(rowsWithBadOutcome),
    setsWithoutControl: Object.freeze(setsWithoutControl),
    setsWithoutTreated: Object.freeze(setsWithoutTreated),
    setsWithSeveralTreated: Object.freeze(setsWithSeveralTreated),
    droppedMissingTreatedOutcome: Object.freeze(droppedMissingTreatedOutcome),
    droppedMissingControlOutcomes: Object.freeze(droppedMissingControlOutcomes),
  });
}

/** The same sets with every outcome transformed (e.g. negated for the alternative `less`). */
export function mapMatchedSetsOutcomes(layout: MatchedSetsLayout, f: (y: number) => number): MatchedSetsLayout {
  return Object.freeze({ sets: layout.sets, start: layout.start, values: layout.values.map(f), ids: layout.ids });
}
