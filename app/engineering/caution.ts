// Owns the engine's version stamp and the caution every result carries. Saved calculations record the version
// so a later reader knows which rules and correlations produced them.

export const ENGINE_VERSION = "1.0.0";

export const CAUTION =
  "These results support the judgement of a registered professional engineer; they do not replace it. " +
  "They defer to SANS 10254, SANS 10252-1, local by-laws and licensed practice. Check every input and " +
  "every result against the installation before relying on it.";
