/**
 * Warnings a result carries, each with a typed code and a sentence. Code reads the code (what to flag, what
 * to badge); people read the sentence, whose wording is free to change.
 */
export type WarningCode =
  | 'below-physical-minimum'
  | 'above-physical-maximum'
  | 'no-spread'
  | 'incomplete-subgroup'
  | 'no-within-spread'
  | 'not-shown-stable'
  | 'requested-model-fits-poorly'
  | 'normality-rejected'
  | 'model-mass-below-zero'
  | 'no-model-interval'
  | 'no-model-fits'
  | 'rough-percentiles'
  | 'coarse-resolution'
  | 'requirement-not-testable'
  | 'small-sample'
  | 'few-values-for-normality'
  | 'few-units';

export class WarningList {
  readonly texts: string[] = [];
  readonly codes: WarningCode[] = [];

  add(code: WarningCode, text: string): void {
    this.codes.push(code);
    this.texts.push(text);
  }
}
