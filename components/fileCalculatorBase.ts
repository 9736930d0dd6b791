import { state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import type { MethodModule, MethodOutcome, MethodSummary } from '../src/methods/methodModule';
import { CalculatorElement } from './calculatorBase';
import type { FileFormView } from './fileFields';

/** What a run needs now: an outcome at once, or a Web Worker run (with the outcome and progress shown meanwhile). */
export type FileRunPlan<Outcome, Progress> =
  | { readonly kind: 'done'; readonly outcome: Outcome }
  | {
      readonly kind: 'worker';
      /** The outcome shown while the worker runs. */
      readonly waiting: Outcome;
      /** The progress shown before the worker's first report. */
      readonly progress: Progress;
      run(options: { signal: AbortSignal; onProgress: (progress: Progress) => void }): Promise<Outcome>;
    };

/** What was read of a chosen file: its columns, its whole text when small enough, or why it could not be read. */
export interface ChosenFileRead {
  readonly columns: readonly string[];
  readonly text: string | null;
  /** "" when the file could be read. */
  readonly problem: string;
}

/** Bytes read from the start of a file to find its header row. */
const HEADER_BYTES = 64 * 1024;

/**
 * Reads a chosen CSV file's header row (from its first 64 KiB) and, when the file is no larger than
 * `wholeTextBytes`, its whole text (a larger file is read by the Web Worker).
 */
export async function readCsvHead(file: File, wholeTextBytes: number, headerOf: (sample: string) => string[]): Promise<ChosenFileRead> {
  try {
    const columns = headerOf(await file.slice(0, HEADER_BYTES).text());
    const text = file.size <= wholeTextBytes ? await file.text() : null;
    return { columns, text, problem: '' };
  } catch {
    return { columns: [], text: null, problem: `${file.name} could not be read.` };
  }
}

/**
 * A calculator whose data come from a CSV file chosen in the page: the file and its columns, a run at once or in
 * a Web Worker with progress and Cancel (a newer evaluation takes over from a running one), `lurk-result` owed
 * until a worker run ends, and the plots remade when the result changes. A calculator sets `method`, `listField`,
 * `fileField` and implements `planRun()`, `readFile()`, `columnsFor()`, `plotsFor()` and `render()`.
 */
export abstract class FileCalculatorElement<
  Form extends { readonly fileName: string },
  Outcome extends MethodOutcome,
  Progress,
  Specs,
  Summary extends MethodSummary,
> extends CalculatorElement<Form, Outcome> {
  protected abstract override readonly method: MethodModule<Form, Outcome, Summary>;
  @state() protected columns: readonly string[] = [];
  @state() protected fileProblem = '';
  @state() protected progress: Progress | null = null;

  protected file: File | null = null;
  protected fileText: string | null = null;
  private abort: AbortController | null = null;
  /** Whether the user has edited the form (a restored form shows no "required" problems until then). */
  protected userStarted = false;
  /** A user's edit started a worker run: `lurk-result` is fired when it ends. */
  private resultOwed = false;
  private evaluatedKey: { form: Form; file: File | null; text: string | null } | null = null;
  private plottedFor: unknown = undefined;
  protected specs!: Specs;

  /** The list field (Γ or Λ values) under which a problem of any of its values is shown. */
  protected abstract readonly listField: string;
  /** The form field whose problem is shown under the file input. */
  protected abstract readonly fileField: string;
  /** Whether the plots show the study's labels (then a change of labels remakes them). */
  protected readonly plotsShowStudy: boolean = true;

  /** What the form (with the chosen file) needs: an outcome at once or a worker run. */
  protected abstract planRun(): FileRunPlan<Outcome, Progress>;
  /** Reads a newly chosen file's columns (and its text when small). */
  protected abstract readFile(file: File): Promise<ChosenFileRead>;
  /** The column choices for a new file's columns: none when the form's choices are all there, else guesses. */
  protected abstract columnsFor(columns: readonly string[]): Partial<Form>;
  /** The plot specs of a result (or the empty specs when there is none). */
  protected abstract plotsFor(result: Outcome['result']): Specs;

  /** Headline numbers of the current result, for the workspace (null while there is none). */
  override get summary(): Summary | null {
    return this.outcome.result ? this.method.workspace.summarise(this.outcome) : null;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    super.willUpdate(changed);
    if (this.plottedFor !== this.outcome.result || (this.plotsShowStudy && changed.has('study'))) {
      this.plottedFor = this.outcome.result;
      this.specs = this.plotsFor(this.outcome.result);
    }
  }

  override disconnectedCallback(): void {
    super.disconnectedCallback();
    this.abort?.abort();
  }

  /** What the form view needs from this element. */
  protected formHooks(): FileFormView<Form> {
    return {
      form: this.form,
      columns: this.columns,
      chosenFile: this.file?.name ?? null,
      fileError: this.fileProblem || (this.outcome.started ? (this.problemFor(this.fileField)?.message ?? '') : ''),
      problemFor: (field) => this.problemFor(field),
      field: (...args) => this.field(...args),
      edit: (change) => this.edit(change),
      onFile: (event) => void this.onFile(event),
    };
  }

  /** Stops a running worker (Cancel). */
  protected cancel(): void {
    this.abort?.abort();
  }

  /** Runs the analysis again with the same form and file. */
  protected runAgain(): void {
    this.evaluatedKey = null;
    this.evaluate();
  }

  /** A problem of the list field is shown under the list, whichever value it names. */
  protected override problemFor(field: string): InputProblem | undefined {
    return super.problemFor(field) ?? (field === this.listField ? this.shown().find((p) => p.field.startsWith(`${this.listField}[`)) : undefined);
  }

  protected override edit(change: Partial<Form>): void {
    this.userStarted = true;
    super.edit(change);
  }

  /** While the worker runs, the result event waits for its end. */
  protected override fireResult(): void {
    if (this.abort) this.resultOwed = true;
    else super.fireResult();
  }

  /** Reads the form with the method's runner: at once, or in the Web Worker (then the outcome comes later). */
  protected evaluate(): void {
    // A change of the study's labels alone needs no new analysis (nor a new worker run).
    const key = { form: this.form, file: this.file, text: this.fileText };
    if (this.evaluatedKey && key.form === this.evaluatedKey.form && key.file === this.evaluatedKey.file && key.text === this.evaluatedKey.text) return;
    this.evaluatedKey = key;
    this.abort?.abort();
    this.abort = null;
    this.progress = null;
    this.resultOwed = false;
    const plan = this.planRun();
    if (plan.kind === 'done') {
      this.outcome = plan.outcome;
      return;
    }
    this.outcome = plan.waiting;
    const controller = new AbortController();
    this.abort = controller;
    this.progress = plan.progress;
    void plan.run({ signal: controller.signal, onProgress: (p) => (this.progress = p) }).then((outcome) => {
      if (this.abort !== controller) return; // a newer evaluation took over
      this.abort = null;
      this.progress = null;
      this.outcome = outcome;
      if (this.resultOwed) {
        this.resultOwed = false;
        super.fireResult();
      }
    });
  }

  private async onFile(event: Event): Promise<void> {
    const input = event.target as HTMLInputElement;
    const file = input.files?.[0];
    if (!file) return;
    this.file = file;
    this.fileText = null;
    const read = await this.readFile(file);
    this.columns = read.columns;
    this.fileText = read.text;
    this.fileProblem = read.problem || (read.columns.length === 0 ? `${file.name} is empty or has no header row.` : '');
    this.edit({ fileName: file.name, ...this.columnsFor(read.columns) } as Partial<Form>);
  }
}
