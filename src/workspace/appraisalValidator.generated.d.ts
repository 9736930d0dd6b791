// Types of the generated validator (see src/workspace/buildAppraisalValidator.mjs).
export interface SchemaError {
  readonly instancePath: string;
  readonly schemaPath: string;
  readonly keyword: string;
  readonly params: Record<string, unknown>;
}
export interface SchemaValidator {
  (data: unknown): boolean;
  errors?: SchemaError[] | null;
}
export const validate: SchemaValidator;
export default validate;
