// Control characters in text people type. A one-line name takes none (a tab or line
// break in a name is a paste accident); free text takes tabs and line breaks, but never
// NUL, escape sequences or the other C0 and C1 controls.

/** C0 and C1 control characters, tabs and line breaks included. */
export const NAME_CONTROL_CHARS = /[\u0000-\u001F\u007F-\u009F]/;

/** Control characters other than tab, line feed and carriage return. */
export const TEXT_CONTROL_CHARS = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/;

export const noControlInName = (s: string) => !NAME_CONTROL_CHARS.test(s);
export const noControlInText = (s: string) => !TEXT_CONTROL_CHARS.test(s);

export const NAME_CONTROL_MESSAGE = "No control characters (tabs, line breaks and the like).";
export const TEXT_CONTROL_MESSAGE = "No control characters other than tabs and line breaks.";
