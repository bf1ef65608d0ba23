/**
 * Turns the payments SDK's form encoding (`line_items[0][price]=p&metadata[k]=v`) back into a
 * nested object. Keys made only of digits become array indexes. Values stay strings; the caller
 * converts the few numbers and booleans it reads.
 */
export type FormValue = string | FormValue[] | { [key: string]: FormValue };

export function parseFormBody(text: string): Record<string, FormValue> {
  const root: Record<string, FormValue> = {};
  for (const [rawKey, value] of new URLSearchParams(text)) {
    const parts = rawKey.split(/\[|\]\[|\]/).filter((p, i) => p !== "" || i === 0);
    let node: Record<string, FormValue> | FormValue[] = root;
    for (let i = 0; i < parts.length; i++) {
      const key = parts[i]!;
      const last = i === parts.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(parts[i + 1]!);
      const slot = Array.isArray(node) ? Number(key) : key;
      const container = node as Record<string | number, FormValue>;
      if (last) {
        container[slot] = value;
      } else {
        if (typeof container[slot] !== "object" || container[slot] === null) container[slot] = nextIsIndex ? [] : {};
        node = container[slot] as Record<string, FormValue> | FormValue[];
      }
    }
  }
  return root;
}

export function str(v: FormValue | undefined): string | undefined {
  return typeof v === "string" ? v : undefined;
}

export function obj(v: FormValue | undefined): Record<string, FormValue> {
  return v && typeof v === "object" && !Array.isArray(v) ? v : {};
}

export function list(v: FormValue | undefined): FormValue[] {
  if (Array.isArray(v)) return v;
  // `items[0]` with a sparse index arrives as an object keyed by digits.
  if (v && typeof v === "object") return Object.keys(v).sort((a, b) => Number(a) - Number(b)).map((k) => (v as Record<string, FormValue>)[k]!);
  return [];
}

export function stringMap(v: FormValue | undefined): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, val] of Object.entries(obj(v))) if (typeof val === "string") out[k] = val;
  return out;
}
