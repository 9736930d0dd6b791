import { describe, expect, it } from 'vitest';
import { statementCitation } from '../../src/format/citation';

describe('statementCitation', () => {
  it('writes a journal article in the statement style', () => {
    expect(statementCitation('VanderWeele TJ, Ding P (2017). Sensitivity analysis in observational research: introducing the E-value. Annals of Internal Medicine 167(4):268–274.')).toBe(
      'VanderWeele TJ, Ding P. Sensitivity analysis in observational research: introducing the E-value. Annals of Internal Medicine. 2017;167(4):268–274.',
    );
  });
  it('keeps a closing note at the end', () => {
    expect(statementCitation('VanderWeele TJ (2017). On a square-root transformation of the odds ratio for a common outcome. Epidemiology 28(6):e58–e60 (recalled from memory).')).toBe(
      'VanderWeele TJ. On a square-root transformation of the odds ratio for a common outcome. Epidemiology. 2017;28(6):e58–e60. (recalled from memory)',
    );
  });
  it('keeps a parenthesis and a dash note after the pages', () => {
    expect(statementCitation('Tan Z (2006) A distributional approach for causal inference using propensity scores. Journal of the American Statistical Association 101(476):1619–1637 (the marginal sensitivity model) — recalled from memory.')).toBe(
      'Tan Z. A distributional approach for causal inference using propensity scores. Journal of the American Statistical Association. 2006;101(476):1619–1637. (the marginal sensitivity model) — recalled from memory',
    );
  });
  it('writes a book with its year after its words', () => {
    expect(statementCitation('Rosenbaum PR (2002) Observational Studies, 2nd ed. New York: Springer, chapter 4.')).toBe('Rosenbaum PR. Observational Studies, 2nd ed. New York: Springer, chapter 4. 2002.');
  });
});
