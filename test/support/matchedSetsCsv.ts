/** A data set of test/reference/matched_sets.json: one value per unit. */
export interface MatchedSetsFixture {
  readonly setIds: readonly string[];
  readonly treated: readonly number[];
  readonly outcomes: readonly (number | null)[];
}

/**
 * The data set as a CSV file with a header (set, treated, outcome), one row per unit in the fixture's order; a
 * missing outcome is an empty cell. `semicolon` writes a semicolon-separated file with decimal commas.
 */
export function matchedSetsCsv(ds: MatchedSetsFixture, options: { semicolon?: boolean; header?: [string, string, string] } = {}): string {
  const sep = options.semicolon ? ';' : ',';
  const number = (y: number | null) => (y === null ? '' : options.semicolon ? String(y).replace('.', ',') : String(y));
  const header = (options.header ?? ['set', 'treated', 'outcome']).join(sep);
  return [header, ...ds.setIds.map((id, i) => [id, String(ds.treated[i]), number(ds.outcomes[i])].join(sep))].join('\n') + '\n';
}
