/**
 * Identifiers made unique for labelling: lenses of one part number come from
 * different work orders, and two clients may mark their lenses alike. The
 * second "L-01" becomes "L-01 (2)", and so on, in the given order.
 */
export function uniqueIdentifiers(identifiers: readonly string[]): string[] {
  const taken = new Set(identifiers);
  const seen = new Map<string, number>();
  return identifiers.map((identifier) => {
    const count = (seen.get(identifier) ?? 0) + 1;
    seen.set(identifier, count);
    if (count === 1) return identifier;
    let candidate = `${identifier} (${count})`;
    for (let extra = count; taken.has(candidate); extra += 1) candidate = `${identifier} (${extra + 1})`;
    taken.add(candidate);
    return candidate;
  });
}
