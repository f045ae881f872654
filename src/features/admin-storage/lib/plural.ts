/** "1 frame", "3 frames": the noun agrees with the count. */
export function plural(count: number, singular: string, pluralForm = `${singular}s`): string {
  return count === 1 ? singular : pluralForm;
}
