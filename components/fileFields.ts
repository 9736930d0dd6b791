import { html, nothing, type TemplateResult } from 'lit';
import type { InputProblem } from '../src/core/inputProblem';

/** What a form with a CSV file input needs from its element: the form, the file's columns, problems and the edit hooks. */
export interface FileFormView<Form> {
  readonly form: Form;
  readonly columns: readonly string[];
  /** The name of the file chosen in this session (null when none: a saved form's file must be chosen again). */
  readonly chosenFile: string | null;
  /** The message under the file input ("" when none). */
  readonly fileError: string;
  problemFor(field: string): InputProblem | undefined;
  field(field: string, label: string, value: string, change: (text: string) => Partial<Form>, hint?: string, inputMode?: 'decimal' | 'numeric' | 'text'): TemplateResult;
  edit(change: Partial<Form>): void;
  onFile(event: Event): void;
}

/** What the CSV file input shows. */
export interface CsvFileInput {
  /** The hint once a file is chosen in this session (null while none is). */
  readonly chosenHint: string | null;
  /** The name of the file in a saved form ("" when none): it must be chosen again. */
  readonly savedName: string;
  /** The hint before any file is chosen: what the file must hold. */
  readonly emptyHint: string;
  /** Whether the input is marked invalid. */
  readonly invalid: boolean;
  /** The message under the input ("" when none). */
  readonly error: string;
  /** Whether the message is announced at once (role "alert"). */
  readonly alert?: boolean;
  onFile(event: Event): void;
}

/** The CSV file input (id `file`) with its hint (`file-hint`) and error line (`file-error`). */
export function csvFileInput(o: CsvFileInput): TemplateResult {
  return html`<div class="field">
    <label for="file">CSV file</label>
    <input
      id="file"
      type="file"
      accept=".csv,.tsv,.txt,text/csv,text/plain"
      aria-describedby="file-hint file-error"
      aria-invalid=${o.invalid ? 'true' : 'false'}
      @change=${(e: Event) => o.onFile(e)}
    />
    <div class="hint" id="file-hint">
      ${o.chosenHint !== null
        ? o.chosenHint
        : o.savedName
          ? `Choose ${o.savedName} again: the rows of a file are never saved, only the choices below.`
          : o.emptyHint}
    </div>
    <div class="field-error" id="file-error" role=${o.alert && o.error ? 'alert' : nothing}>${o.error}</div>
  </div>`;
}

/** What a column picker shows. */
export interface ColumnSelect {
  /** The select's id; its error line is `${id}-error` unless `errorId` says otherwise. */
  readonly id: string;
  readonly errorId?: string;
  readonly label: string;
  /** The chosen column ("" when none). */
  readonly value: string;
  readonly columns: readonly string[];
  readonly problem: InputProblem | undefined;
  onChange(column: string): void;
}

/** A labelled select of a file's columns ("Choose a column" first), with its error line. */
export function columnSelect(o: ColumnSelect): TemplateResult {
  const errorId = o.errorId ?? `${o.id}-error`;
  return html`<div class="field">
    <label for="${o.id}">${o.label}</label>
    <select id="${o.id}" aria-invalid=${o.problem ? 'true' : 'false'} aria-describedby="${errorId}" @change=${(e: Event) => o.onChange((e.target as HTMLSelectElement).value)}>
      <option value="" ?selected=${o.value === ''}>Choose a column</option>
      ${o.columns.map((c) => html`<option value=${c} ?selected=${o.value === c}>${c}</option>`)}
    </select>
    <div class="field-error" id="${errorId}">${o.problem ? o.problem.message : ''}</div>
  </div>`;
}

/** What `chosenFileInput` needs of a file form's view. */
export type ChosenFileView = Pick<FileFormView<unknown>, 'columns' | 'chosenFile' | 'fileError' | 'onFile'> & { readonly form: { readonly fileName: string } };

/**
 * The CSV file input of a file form: once a file is chosen, its hint names the file and its columns (`names`) or
 * counts them (`count`); the error line shows the view's file error.
 */
export function chosenFileInput(v: ChosenFileView, emptyHint: string, columnsShown: 'names' | 'count'): TemplateResult {
  const columns = columnsShown === 'names' ? `columns ${v.columns.join(', ')}` : `${v.columns.length} columns`;
  return csvFileInput({
    chosenHint: v.chosenFile ? `${v.chosenFile}: ${columns}. It stays in this browser.` : null,
    savedName: v.form.fileName,
    emptyHint,
    invalid: v.fileError !== '',
    error: v.fileError,
    onFile: (e) => v.onFile(e),
  });
}

/** The "Columns" fieldset, shown once the file's columns are known. */
export function columnsFieldset(columns: readonly string[], content: TemplateResult): TemplateResult | typeof nothing {
  return columns.length > 0
    ? html`<fieldset>
        <legend>Columns</legend>
        ${content}
      </fieldset>`
    : nothing;
}
