/** A useId() value made safe for url(#…) references in SVG attributes. */
export function svgSafeId(reactId: string, suffix: string): string {
  return `p${reactId.replace(/[^a-zA-Z0-9_-]/g, '')}-${suffix}`;
}
