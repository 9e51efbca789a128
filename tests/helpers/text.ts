/** A terminal report as one line, so a phrase the report wrapped to its width can be matched whole. */
export const unwrapped = (s: string): string => s.replace(/\s*\n\s*/g, ' ');
