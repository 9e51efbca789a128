/**
 * Control characters (C0, DEL, C1) in text that reaches a terminal or a page, each shown as U+FFFD:
 * an ESC or a carriage return in a plan label could otherwise rewrite what the report says.
 */
const CONTROLS = /[\u0000-\u001f\u007f-\u009f]/g;

export const printable = (s: string): string => s.replace(CONTROLS, '\ufffd');

/** The same for a line of the terminal report, whose own line breaks and tabs stay. */
const CONTROLS_BUT_LAYOUT = /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g;

export const printableLines = (s: string): string => s.replace(CONTROLS_BUT_LAYOUT, '\ufffd');
