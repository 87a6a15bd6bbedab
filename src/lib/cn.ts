/** Joins class names, skipping the falsy ones, so components can switch classes inline. */
export function cn(...parts: Array<string | false | null | undefined>): string {
  return parts.filter(Boolean).join(" ");
}
