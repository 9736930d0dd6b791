/**
 * The plain-language reading of a result as every command's JSON gives it (`reading` in `lurk evalue --json`,
 * `lurk pairs --json`, …): the sentences in the order a reader needs them, and the same sentences as one text.
 * A method may add named parts (the E-value's `estimate` and `interval` sentences).
 */
export interface JsonReading {
  /** The sentences joined by a space: the reading as one paragraph. */
  readonly text: string;
  /** The sentences in order (none when there is nothing to say). */
  readonly sentences: readonly string[];
}

/** The reading in the one JSON shape: `{ text, sentences, ...parts }`. */
export function jsonReading<P extends Readonly<Record<string, unknown>>>(sentences: readonly string[], parts?: P): JsonReading & P {
  return { text: sentences.join(' '), sentences: [...sentences], ...(parts ?? ({} as P)) };
}
