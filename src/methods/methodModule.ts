import type { InputProblem } from '../core/inputProblem';
import type { ByteSource } from '../data/byteSource';
import type { StudyLabels } from '../format/studyLabels';
import type { PlotSpec } from '../plot/plotSpec';

/**
 * What one method (E-value, matched pairs, regression, …) gives every face of Lurk. The page's tabs, the
 * command line's commands and help, appraisal files, share links, the statement and the bottom line iterate
 * the registry (`./registry.ts`) of these; adding a method is one folder under `src/methods/` and one line there.
 *
 * The flow is the same on every surface:
 *   typed text (a form, command-line options, a batch row, a share link, a file) → `Form` (text, never numbers)
 *   → `read(form, data)` (the one request reader: every problem named by its form field) → `Outcome`
 *   → `report` (text and JSON) / plots / `workspace` (summary, statement paragraph, bottom-line sentences).
 */
export interface MethodModule<Form = unknown, Outcome extends MethodOutcome = MethodOutcome, Summary extends MethodSummary = MethodSummary> {
  /** The key of the method in appraisal files and share links (`evalue`, `pairs`, `regression`, …). */
  readonly id: string;
  /** The tab's label on the page. */
  readonly title: string;
  /** The page's view of the method: its element's tag name, the heading and one line under it. */
  readonly view: { readonly element: string; readonly heading: string; readonly intro: string };
  readonly form: FormKit<Form>;
  readonly command: CommandKit<Form>;
  readonly workspace: WorkspaceKit<Form, Outcome, Summary>;
}

/** The form as typed: empty, completed from something saved, and which fields hold raw data (never shared). */
export interface FormKit<Form> {
  empty(): Form;
  /** A complete form from a saved object (partial, older, numbers where text was expected: taken as their text). */
  normalise(saved: unknown): Form;
  /** Form fields that hold raw data rows (pasted data): left out of share links. */
  readonly rawDataFields: readonly string[];
}

/** One command-line option: its kind, an optional one-letter form, and the form field it fills. */
export interface OptionSpec {
  readonly type: 'string' | 'boolean';
  readonly short?: string;
}

export type OptionValues = Readonly<Record<string, string | boolean | undefined>>;

/** A file the user chose: on the page a File, on the command line a path or standard input. */
export interface FileSource {
  readonly name: string;
  /** The size in bytes where known (for the fingerprint and the choice of a Web Worker). */
  readonly size: number | null;
  text(): Promise<string>;
  bytes(): ByteSource;
}

/** What a method's command needs from the command line (options, help) and how options become its form. */
export interface CommandKit<Form> {
  /** The sub-command's name (`lurk NAME`). */
  readonly name: string;
  /** One line for `lurk --help`. */
  readonly summary: string;
  readonly help: string;
  readonly options: Readonly<Record<string, OptionSpec>>;
  /**
   * The figures the command can print as SVG (`--svg NAME`; the same figures the page draws), in the order the
   * page shows them. The command line adds --svg and --svg-width and lists these in the help.
   */
  readonly figures: readonly CommandFigure[];
  /**
   * The form the options give (text as typed). Throws `InputError` with fields named as options
   * (`--counts`) for mixes the form cannot express (two sources at once).
   */
  formFromOptions(values: OptionValues): Form;
  /** The command-line option a form field stands for (`counts.a` → `--counts`), for messages. */
  optionOf(field: string): string;
  /**
   * Reads the form with the method's request reader (and any file it names, through `context.open`), runs the
   * method and returns its report. Bad input is thrown as `InputError` with problems named by form field.
   */
  run(form: Form, values: OptionValues, context: CommandContext): Promise<CommandReport>;
}

/** What a command may use outside the method: files (a path, or "-" for standard input). */
export interface CommandContext {
  open(path: string): FileSource;
}

/** A figure of a command's analysis, printed as SVG with `--svg NAME`. */
export interface CommandFigure {
  /** The name typed after --svg: a plain word or two for what the figure shows (`p-value`, `overlap`). */
  readonly name: string;
  /** What the figure shows, for --help (a short phrase). */
  readonly shows: string;
  /** When a result has no such figure (e.g. "there is no tipping Γ"), for the message; omitted when every result has it. */
  readonly absentWhen?: string;
}

/**
 * A command's output: the report for people, the JSON object for --json, and the figures of the analysis by
 * name (built only when asked for with --svg; a builder gives null when this result has no such figure). A
 * report without an analysis (a query printed for --sql) has no figures.
 */
export interface CommandReport {
  readonly text: string;
  readonly json: unknown;
  readonly figures?: Readonly<Record<string, () => PlotSpec | null>>;
}

/** What a method's reading of a form gives: the result (or null), every problem by field, and whether started. */
export interface MethodOutcome {
  readonly result: unknown;
  readonly problems: readonly InputProblem[];
  /** Whether the user has entered the main values yet: until then "required" problems are not worth showing. */
  readonly started: boolean;
}

/** Headline numbers of a result as plain JSON, kept in appraisal files. */
export type MethodSummary = { readonly kind: string } & Readonly<Record<string, unknown>>;

/** A method's part of the workspace: its summary, its statement paragraph and its bottom-line sentences. */
export interface WorkspaceKit<Form, Outcome extends MethodOutcome, Summary extends MethodSummary> {
  summarise(outcome: Outcome): Summary | null;
  /** A summary read back from a file or link, checked field by field; null when it is not this method's. */
  readSummary(saved: unknown): Summary | null;
  /** Whether the form's numbers come from raw data that is not saved (a file): then the saved summary is used. */
  needsData(form: Form): boolean;
  /** The summary of a form that needs no data, read and run now (null while it has problems). */
  summaryFromForm(form: Form): Summary | null;
  statement(summary: Summary, study: StudyLabels, cite: (reference: string) => string): StatementPart | null;
  bottomLine(summary: Summary, study: StudyLabels): BottomLinePart;
}

/** A method's paragraph of the robustness statement, with the conventions it relied on. */
export interface StatementPart {
  readonly paragraph: string;
  /** Conventions and assumptions of this analysis, each one sentence, for the statement's assumptions section. */
  readonly assumptions: readonly string[];
}

/** A method's sentences of the bottom line. */
export interface BottomLinePart {
  readonly howStrong: readonly string[];
  readonly comparedWithMeasured: readonly string[];
  readonly wouldChange: readonly string[];
  readonly wouldNotChange: readonly string[];
}
