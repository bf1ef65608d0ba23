/**
 * A short code for each entity type, shown under a span so the type is readable without its
 * colour. Names of up to four characters are their own code; longer names use their first
 * letters (up to four, after dropping separators). When two names would share a code the later
 * one gets its next letters instead, so codes stay distinct within one schema.
 */
export function typeCodes(names: readonly string[]): Map<string, string> {
  const codes = new Map<string, string>();
  const used = new Set<string>();
  for (const name of names) {
    if (codes.has(name)) continue;
    const letters = name.replace(/[^\p{L}\p{N}]/gu, "").toUpperCase() || name.toUpperCase();
    let code = letters.length <= 4 ? letters : letters.slice(0, 3);
    for (let i = 3; used.has(code) && i < letters.length; i++) code = letters.slice(0, 2) + letters[i];
    for (let n = 2; used.has(code); n++) code = `${letters.slice(0, 3)}${n}`;
    used.add(code);
    codes.set(name, code);
  }
  return codes;
}

/** The code of one type when the schema is unknown (its own first letters). */
export function typeCode(name: string): string {
  return typeCodes([name]).get(name)!;
}
