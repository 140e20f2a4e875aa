export const REPORT_CAUTION =
  "Takeproof's default thresholds are a starting point only: the studio's and the broadcaster's own delivery specs and local rules take precedence over them.";
