// How every tolerance field is read, said once beside the field and in its tooltip.

/** Short line under a tolerance field. */
export const TOLERANCE_HINT = 'in %: 5 means 5 %';

/** The full rule, as a tooltip. */
export const TOLERANCE_RULE =
  'Typed in percent, the % sign optional: 5 means 5 %. A tolerance is read as the half-width of a rectangular distribution: its standard uncertainty is tol/√3 (GUM 4.3.7).';
