/**
 * Decodes the payment API's form encoding: `metadata[batch]=2025-03`, `expand[]=customer`,
 * `expand[0]=customer`, `address[line1]=...`. The SDK writes nested params this way
 * (qs with bracket indices); the fake reads them back into plain objects and arrays.
 */

export type FormValue = string | FormValue[] | { [key: string]: FormValue };
export type FormObject = { [key: string]: FormValue };

/** Keys under these parents are free-form strings, even when they look like array indices. */
const FREE_FORM_PARENTS = new Set(["metadata"]);

export function parseForm(body: string): FormObject {
  const root: FormObject = {};
  for (const pair of body.split("&")) {
    if (!pair) continue;
    const eq = pair.indexOf("=");
    const rawKey = decode(eq === -1 ? pair : pair.slice(0, eq));
    const value = eq === -1 ? "" : decode(pair.slice(eq + 1));
    const path = splitKey(rawKey);
    if (path.length === 0 || path[0] === "") continue;
    let node: FormObject = root;
    for (let i = 0; i < path.length - 1; i++) {
      const seg = path[i] === "" ? String(Object.keys(node).length) : path[i]!;
      const next = node[seg];
      if (typeof next !== "object" || next === null || Array.isArray(next)) node[seg] = {};
      node = node[seg] as FormObject;
    }
    const last = path[path.length - 1]!;
    node[last === "" ? String(Object.keys(node).length) : last] = value;
  }
  return toArrays(root, "") as FormObject;
}

function decode(s: string): string {
  try {
    return decodeURIComponent(s.replace(/\+/g, " "));
  } catch {
    return s;
  }
}

/** `a[b][0]` → ["a", "b", "0"]; `expand[]` → ["expand", ""]. */
function splitKey(key: string): string[] {
  const open = key.indexOf("[");
  if (open <= 0) return [key];
  const out = [key.slice(0, open)];
  const re = /\[([^\]]*)\]/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(key.slice(open)))) out.push(m[1]!);
  return out;
}

function toArrays(value: FormValue, parentKey: string): FormValue {
  if (typeof value === "string" || Array.isArray(value)) return value;
  const keys = Object.keys(value);
  const converted: FormObject = {};
  for (const k of keys) converted[k] = toArrays(value[k]!, k);
  if (keys.length > 0 && !FREE_FORM_PARENTS.has(parentKey) && keys.every((k) => /^\d+$/.test(k))) {
    return keys.sort((a, b) => Number(a) - Number(b)).map((k) => converted[k]!);
  }
  return converted;
}
