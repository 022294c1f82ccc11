/** What every calculator returns; the API sends exactly this shape. */
export type CheckLevel = 'info' | 'warning' | 'danger';

export interface Check {
  /** Stable, machine-readable; snake_case. */
  code: string;
  level: CheckLevel;
  message: string;
}

export interface CalcOutput<T> {
  data: T;
  checks: Check[];
  cautions: string[];
  /** Which table, standard or model produced the result, with edition. */
  basis: string[];
}
