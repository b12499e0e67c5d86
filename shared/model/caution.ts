/** The engineering caution shown wherever results appear (README, UI, calc sheet, CLI). */
export const CAUTION =
  'Design aid only: every result must be verified by a qualified engineer against the code edition, ' +
  'owner specifications and local jurisdiction in force. Spoolwright does not cover every code requirement ' +
  '(e.g. sustained and occasional loads, fatigue, branch reinforcement); a test pressure shown is the B31.3 para. 345.4.2 value only, ' +
  'the test itself is set by the owner and the code edition.';
