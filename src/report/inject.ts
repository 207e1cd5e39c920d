// Formula-injection guard for spreadsheet exports (OWASP "CSV Injection"; CWE-1236).
// Text from a dump (net and scope names) is untrusted. A spreadsheet evaluates a cell as a formula
// when it starts with = + - @, tab, CR or LF, so such text gets a leading apostrophe, which makes the
// program show it as plain text. Leading spaces before a trigger are caught too, since some programs
// skip them. Numbers are never touched: they are written as numeric cells.

const TRIGGER = /^[\s\0]*[=+\-@]|^[\t\r\n\0]/;

export function neutralizeText(text: string): string {
  return TRIGGER.test(text) ? `'${text}` : text;
}
