/** The caution every report carries at its top. */
export const CAUTION_TEXT =
  "The figures in this report are model interpretations of the recorded data, not measurements of the aquifer. " +
  "Aquifer-test interpretation, and any decision based on it, is for qualified professionals. " +
  "Local regulations, permits and licensed practice govern: where they differ from anything in this report, they take precedence.";
