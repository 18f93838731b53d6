/** Joins class names, skipping the ones a condition switched off. */
export const cn = (...parts: Array<string | false | null | undefined>) => parts.filter(Boolean).join(' ');
