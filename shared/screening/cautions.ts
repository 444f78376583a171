// The cautions printed beside every recommendation. A leaf module (no imports), so a screen can show them without
// loading the engine.

/** Cautions text (product brief, "Cautions"), reused by the screens, the PDF and the e-mail. */
export const CAUTIONS: readonly string[] = [
  'The recommendation is decision support for qualified staff.',
  "Re-energising a transformer after a fault is a safety decision governed by the utility's own procedures, local codes and licensed practice; criteria defaults come from published guidance and common practice and must be reviewed by the user's engineers.",
  "High-voltage tests must follow the test equipment's and the utility's safety rules (isolation, earthing, permits).",
  'A go cannot rule out deformation that the tests taken cannot see.',
  'DC tests (winding resistance) leave the core magnetised: take excitation current and sweeps first, or demagnetise before them.',
];
