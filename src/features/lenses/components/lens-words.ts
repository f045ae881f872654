/** Short names for table cells; the measurement page spells methods out in full. */
export const METHOD_SHORT_WORDS: Record<string, string> = {
  'finite-conjugate': 'Finite conjugates',
  'multi-conjugate': 'Several conjugates',
  displacement: 'Displacement',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
};

export const MEASUREMENT_STATUS_WORDS: Record<string, string> = {
  draft: 'Draft',
  analysing: 'Analysing',
  analysed: 'Analysed',
  'analysis-failed': 'Analysis failed',
  submitted: 'In review',
  approved: 'Approved',
  returned: 'Returned',
  certified: 'Certified',
};

export function methodWords(method: string): string {
  return METHOD_SHORT_WORDS[method] ?? method;
}

export function measurementStatusWords(status: string): string {
  return MEASUREMENT_STATUS_WORDS[status] ?? status;
}
