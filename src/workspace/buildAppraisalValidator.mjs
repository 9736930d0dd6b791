// Compiles src/workspace/appraisal.schema.json into a standalone validator module (no code generation at run
// time, so the page's Content Security Policy needs no 'unsafe-eval'):
//   node src/workspace/buildAppraisalValidator.mjs          writes src/workspace/appraisalValidator.generated.js
//   node src/workspace/buildAppraisalValidator.mjs --check  exits 1 when the committed module is out of date
import { readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import Ajv2020 from 'ajv/dist/2020.js';
import standaloneCode from 'ajv/dist/standalone/index.js';

const schemaPath = fileURLToPath(new URL('./appraisal.schema.json', import.meta.url));
const outPath = fileURLToPath(new URL('./appraisalValidator.generated.js', import.meta.url));

export function appraisalValidatorSource() {
  const schema = JSON.parse(readFileSync(schemaPath, 'utf8'));
  const ajv = new Ajv2020({
    allErrors: false,
    strict: true,
    allowUnionTypes: true,
    validateFormats: false,
    unicodeRegExp: false,
    unicode: false,
    inlineRefs: false,
    messages: false,
    code: { source: true, esm: true, lines: false, optimize: true },
  });
  const validate = ajv.compile(schema);
  const code = standaloneCode(ajv, validate);
  return `// Generated from appraisal.schema.json by src/workspace/buildAppraisalValidator.mjs (ajv standalone). Do not edit.\n/* eslint-disable */\n// @ts-nocheck\n${code}`;
}

const source = appraisalValidatorSource();
if (process.argv.includes('--check')) {
  let current = '';
  try {
    current = readFileSync(outPath, 'utf8');
  } catch {}
  if (current !== source) {
    console.error('appraisalValidator.generated.js is out of date: run node src/workspace/buildAppraisalValidator.mjs');
    process.exit(1);
  }
} else {
  writeFileSync(outPath, source);
}
