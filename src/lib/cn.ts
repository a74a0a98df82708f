/** Joins class names, dropping falsy entries (conditional Tailwind classes). */
export function cn(...parts: Array<string | false | null | undefined>): string {
  return parts.filter(Boolean).join(' ');
}
