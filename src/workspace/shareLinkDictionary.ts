/**
 * The preset dictionary of link format 2 (raw DEFLATE with a preset dictionary, RFC 1951 and RFC 1950 §2.2):
 * text that share links often hold — the appraisal's field names and choices, and the conventions of a
 * matched-pairs summary (a summary that travels when the pasted rows stay behind) — so that a link need not spell
 * them out. Made once from the version-2 schema and the matched-pairs conventions of the time.
 *
 * FROZEN: a link is read with the very dictionary it was made with, so changing one character here makes every
 * link of format 2 unreadable (a test checks its CRC-32). A better dictionary needs a new link format.
 */
export const SHARE_LINK_DICTIONARY: string = [
  "{\"format\":\"lurk-appraisal\",\"version\":2,\"savedAt\":\"\"format\":\"version\":\"savedAt\":\"study\":\"findings\":\"b",
  "atch\":\"inputs\":\"summary\":\"source\":\"measure\":\"estimate\":\"intervalBy\":\"lower\":\"upper\":\"se\":\"level\":\"ou",
  "tcomePrevalence\":\"sd\":\"target\":\"tableMeasure\":\"fileName\":\"exposureColumn\":\"outcomeColumn\":\"counts\":\"",
  "exposedValues\":\"outcomeValues\":\"confounders\":\"design\":\"summaryTable\":\"summaryResult\":\"a\":\"b\":\"c\":\"d\"",
  ":\"name\":\"rrExposure\":\"rrOutcome\":\"kind\":\"targetIsNull\":\"conversion\":\"conversionNote\":\"eValueEstimate",
  "\":\"eValueInterval\":\"intervalLimitUsed\":\"references\":\"rr\":\"or\":\"hr\":\"smd\":\"md\":\"none\":\"odds-ratio-rar",
  "e-outcome\":\"odds-ratio-square-root\":\"hazard-ratio-rare-outcome\":\"hazard-ratio-common-outcome\":\"stand",
  "ardized-mean-difference\":\"mean-difference-via-sd\":\"explainsEstimate\":\"explainsInterval\":\"columnsBy\":",
  "\"treatedColumn\":\"controlColumn\":\"differenceColumn\":\"outcomeType\":\"pasted\":\"treatedOnly\":\"controlOnly",
  "\":\"test\":\"alternative\":\"alpha\":\"gammas\":\"method\":\"continuityCorrection\":\"zeros\":\"n\":\"nonZero\":\"pValu",
  "e\":\"sensitivityValue\":\"sensitivityStatus\":\"searchedUpTo\":\"signTestSensitivityValue\":\"tailMethod\":\"ra",
  "ngeAt\":\"amplification\":\"signrank\":\"sign\":\"greater\":\"less\":\"found\":\"not-significant\":\"beyond-range\":\"",
  "exact\":\"normal\":\"gamma\":\"estimateLow\":\"estimateHigh\":\"intervalLow\":\"intervalHigh\":\"lambda\":\"delta\":\"",
  "setColumn\":\"trim\":\"outcomeKind\":\"tail\":\"dfBy\":\"df\":\"parameters\":\"outcome\":\"treatment\":\"categorical\":",
  "\"benchmarks\":\"summaryColumns\":\"k\":\"q\":\"direction\":\"r2dz\":\"r2yz\":\"plotMax\":\"covariates\":\"covariateTs\"",
  ":\"summaryLevels\":\"kOutcome\":\"seKind\":\"outcomeT\":\"treatmentT\":\"t\":\"partialR2\":\"rv\":\"rvAlpha\":\"toward-",
  "zero\":\"away-from-zero\":\"covariate\":\"correctedEstimate\":\"correctedT\":\"estimand\":\"lambdas\":\"bootstrap\"",
  ":\"seed\":\"trimBelow\":\"trimAbove\":\"calculators\":\"evalue\":\"pairs\":\"sets\":\"regression\":\"weighting\":\"id\":",
  "\"text\":\"finding\":\"exposure\":\"units\":\"summary\":null},{\"id\":\"f{\"id\":\"zero-differences\",\"text\":\"Pairs w",
  "ith a difference of exactly zero are left out of the signed-rank test (Wilcoxon\'s rule) but count in",
  " the Hodges–Lehmann estimate and interval.\"},{\"id\":\"tied-differences\",\"text\":\"Differences whose size",
  "s agree within a relative 1e-10 (about 10 significant digits) count as tied and share the average of",
  " their ranks, so that differences equal on paper but not in binary arithmetic (1.3 − 1.2 and 2.3 − 2",
  ".2) tie.\"},{\"id\":\"one-sided-bounds\",\"text\":\"The p-value bounds are one-sided, compared with α = 0.05",
  "; the sensitivity value is the largest Γ at which the upper bound is still at most α (the name follo",
  "ws Zhao 2019).\"},{\"id\":\"interval-two-sided\",\"text\":\"The sensitivity interval is two-sided at level 0",
  ".95 (α/2 on each side), while the p-value bounds are one-sided at α.\"},{\"id\":\"estimate-whole-number\"",
  ",\"text\":\"Under bias Γ the estimate range uses the expectations N·Γ/(1 + Γ) and N/(1 + Γ) of the sign",
  "ed-rank statistic (N = n(n + 1)/2), with Γ taken as the decimal number it is written as; when one is",
  " a whole number the estimate is the mean of two Walsh averages.\"}",
].join('');
