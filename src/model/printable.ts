/**
 * Control characters (C0, DEL, C1) in text that reaches a terminal or a page, each shown as U+FFFD:
 * an ESC or a carriage return in a plan label could otherwise rewrite what the report says.
 */
export const printable = (s: string): string => replaceControls(s, false);

/** The same for a line of the terminal report, whose own line breaks and tabs stay. */
export const printableLines = (s: string): string => replaceControls(s, true);

const TAB = 0x09;
const LINE_FEED = 0x0a;

export function isControl(code: number, keepLayout = false): boolean {
  if (keepLayout && (code === TAB || code === LINE_FEED)) return false;
  return code < 0x20 || (code >= 0x7f && code <= 0x9f);
}

function replaceControls(s: string, keepLayout: boolean): string {
  let out = '';
  let from = 0;
  for (let i = 0; i < s.length; i++) {
    if (!isControl(s.charCodeAt(i), keepLayout)) continue;
    out += `${s.slice(from, i)}\ufffd`;
    from = i + 1;
  }
  return from === 0 ? s : out + s.slice(from);
}
