// A measurement that cannot be made as asked (a reference level outside a net's swing, a reference
// net outside the group). Callers show the message; the CLI turns it into exit code 2.

export class MeasureError extends Error {}
