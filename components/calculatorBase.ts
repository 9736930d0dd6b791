import { LitElement, html, type TemplateResult } from 'lit';
import { property, state } from 'lit/decorators.js';
import type { InputProblem } from '../src/core/inputProblem';
import { shownProblems } from '../src/format/shownProblems';
import { emptyStudy, type StudyLabels } from '../src/format/studyLabels';
import type { MethodModule, MethodOutcome, MethodSummary } from '../src/methods/methodModule';
import { textField } from './textField';

/** Detail of `lurk-result`: the new result, or null with the problems that prevent one. */
export interface CalculatorResultDetail<Result = unknown> {
  readonly result: Result | null;
  readonly problems: readonly InputProblem[];
}

/**
 * What every calculator element shares: `inputs` (the form as typed) and `study` in, the form kept as text in
 * state, problems shown by field, element ids from field paths, and the two events fired on user edits only.
 * A calculator sets `method` and implements `evaluate()` (its method's request reader and runner) and `render()`.
 */
export abstract class CalculatorElement<Form extends object, Outcome extends MethodOutcome> extends LitElement {
  /** The form as typed (text, never parsed numbers); partial or older objects are completed. */
  @property({ attribute: false }) inputs: Form | Record<string, unknown> | null = null;
  /** The finding's labels (exposure, outcome, units) used in the text and the plots. */
  @property({ attribute: false }) study: StudyLabels = emptyStudy;

  @state() protected form!: Form;
  protected abstract readonly method: MethodModule<Form, Outcome, MethodSummary>;
  protected abstract outcome: Outcome;
  private evaluatedFor: unknown = undefined;

  /** Headline numbers of the current result, for the workspace's appraisal file, statement and bottom line. */
  get summary(): MethodSummary | null {
    return this.outcome ? this.method.workspace.summarise(this.outcome) : null;
  }

  /** Reads the form (and any loaded data) into `this.outcome`; called whenever the form, data or labels change. */
  protected abstract evaluate(): void;

  /** Properties besides the form whose change needs a new evaluation (a loaded file, say). */
  protected dataChanged(_changed: Map<string, unknown>): boolean {
    return false;
  }

  protected override willUpdate(changed: Map<string, unknown>): void {
    if (this.form === undefined) this.form = this.method.form.empty();
    if (changed.has('inputs') && this.inputs !== this.form) this.form = this.method.form.normalise(this.inputs);
    if (this.evaluatedFor !== this.form || changed.has('study') || this.dataChanged(changed)) this.reevaluate();
  }

  protected reevaluate(): void {
    this.evaluate();
    this.evaluatedFor = this.form;
  }

  /** A user's edit: the new form, a new evaluation, then `lurk-inputs-change` and `lurk-result`. */
  protected edit(change: Partial<Form>): void {
    this.form = Object.freeze({ ...this.form, ...change }) as Form;
    this.inputs = this.form;
    this.reevaluate();
    this.fire('lurk-inputs-change', { inputs: this.form });
    this.fireResult();
  }

  protected fireResult(): void {
    const detail: CalculatorResultDetail = { result: this.outcome.result, problems: this.outcome.problems };
    this.fire('lurk-result', detail);
  }

  protected fire(name: string, detail: unknown): void {
    this.dispatchEvent(new CustomEvent(name, { detail, bubbles: true, composed: true }));
  }

  /** The problems shown now: "required" only once the user has started, everything else at once. */
  protected shown(): InputProblem[] {
    return shownProblems(this.outcome.problems, this.outcome.started);
  }

  /** The problem to show beside a field. */
  protected problemFor(field: string): InputProblem | undefined {
    return this.shown().find((p) => p.field === field);
  }

  /** A labelled text input for a form field, with its hint and its error. */
  protected field(field: string, label: string, value: string, change: (text: string) => Partial<Form>, hint = '', inputMode: 'decimal' | 'numeric' | 'text' = 'decimal'): TemplateResult {
    return textField({ id: fieldId(field), label, value, problem: this.problemFor(field), hint, inputMode, onInput: (text) => this.edit(change(text)) });
  }

  /** The error line of a field that is not a text input (a select, a file). */
  protected errorFor(field: string, prefix = ''): TemplateResult {
    const problem = this.problemFor(field);
    return html`<div class="field-error" id="${fieldId(field)}-error">${problem ? prefix + problem.message : ''}</div>`;
  }

  /** Moves the focus to a field's input after the next render (after adding a row, say). */
  protected focusField(field: string): void {
    void this.updateComplete.then(() => (this.renderRoot.querySelector(`#${fieldId(field)}`) as HTMLElement | null)?.focus());
  }
}

/** An element id from a field path: `confounders[1].name` → `confounders-1-name`. */
export function fieldId(field: string): string {
  return field.replace(/[[\].]+/g, '-').replace(/-$/, '');
}

declare global {
  interface GlobalEventHandlersEventMap {
    'lurk-inputs-change': CustomEvent<{ inputs: Record<string, unknown> }>;
    'lurk-result': CustomEvent<{ result: unknown; problems?: readonly InputProblem[] }>;
  }
}
