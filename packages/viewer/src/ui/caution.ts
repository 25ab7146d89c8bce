/** The caution the page always shows (the README and every exported report carry the same message). */
export const PAGE_CAUTION =
  "Conebook computes what its models and the data imply; it does not know the site. Interpreting an aquifer test, and any " +
  "water-supply, dewatering or contamination decision based on it, is for qualified professionals. Local regulations, " +
  "permits and licensed practice govern: where they differ from anything shown here, they take precedence.";
