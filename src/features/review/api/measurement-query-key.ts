/** The measurement page's query key (the measurements feature uses the same); features do not import each other. */
export function measurementKey(measurementId: string) {
  return ['measurements', measurementId] as const;
}
