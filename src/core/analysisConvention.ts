/**
 * One convention an analysis follows, in plain words, with a stable id: what a report, a help text or a
 * robustness statement must tell the reader (e.g. how zero differences are handled, which degrees of freedom
 * a threshold uses). Every user-facing analysis lists the conventions that apply to it in `conventions`.
 */
export interface AnalysisConvention {
  /** A stable identifier (kebab-case), for linking and for tests. */
  readonly id: string;
  /** The convention in one or two plain sentences. */
  readonly text: string;
}

/** Collects conventions and returns them as a frozen list of frozen entries. */
export function conventionList(): { add(id: string, text: string): void; list(): readonly AnalysisConvention[] } {
  const entries: AnalysisConvention[] = [];
  return {
    add(id: string, text: string) {
      entries.push(Object.freeze({ id, text }));
    },
    list() {
      return Object.freeze([...entries]);
    },
  };
}
