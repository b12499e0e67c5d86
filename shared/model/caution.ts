/** The engineering caution shown wherever results appear (README, UI, calc sheet, CLI). */
export const CAUTION =
  'Design aid only: every result must be verified by a qualified engineer against the code edition, ' +
  'owner specifications and local jurisdiction in force. Spoolwright does not cover every code requirement ' +
  '(e.g. sustained and occasional loads, fatigue, branch reinforcement, hydrotest).';
