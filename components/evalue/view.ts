import type { TemplateResult } from 'lit';
import type { InputProblem } from '../../src/core/inputProblem';
import type { CsvTable } from '../../src/data/csv';
import type { StudyLabels } from '../../src/format/studyLabels';
import type { ConfounderText, EValueFormInputs, EValueFormOutcome } from '../../src/methods/evalue/request';
import type { PlotSpec } from '../../src/plot/plotSpec';
import type { PlotPointerDetail } from '../lurk-plot';

/** What the E-value calculator's form and results templates read from the element and call back into it. */
export interface EValueView {
  readonly form: EValueFormInputs;
  readonly outcome: EValueFormOutcome;
  readonly table: CsvTable | null;
  readonly fileProblem: string;
  readonly study: StudyLabels;
  readonly plot: PlotSpec | null;
  readonly readout: string;
  /** The problems shown now ("required" only once the user has started). */
  shown(): InputProblem[];
  problemFor(field: string): InputProblem | undefined;
  /** A labelled text input for a form field, with its hint and its error. */
  field(field: string, label: string, value: string, change: (text: string) => Partial<EValueFormInputs>, hint?: string, inputMode?: 'decimal' | 'numeric' | 'text'): TemplateResult;
  /** The error line of a field that is not a text input, under the given element id. */
  errorLine(field: string, id: string, prefix?: string): TemplateResult;
  edit(change: Partial<EValueFormInputs>): void;
  confounderEdit(index: number, change: Partial<ConfounderText>): Partial<EValueFormInputs>;
  addConfounder(): void;
  removeConfounder(index: number): void;
  onFile(event: Event): void;
  onPointer(event: CustomEvent<PlotPointerDetail>): void;
}
