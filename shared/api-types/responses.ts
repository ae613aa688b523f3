// A response a project can chart, fit or compare: a curve metric or a hand-entered response.

export interface ResponseInfo {
  key: string;
  label: string;
  /** the internal unit the values are in */
  unit: string;
  goal: 'maximize' | 'minimize' | 'target';
  target: number | null;
  source: 'curve' | 'hand-entered';
}
