/**
 * The error record shared by the geometry parsers. Parsers never throw on
 * attribute text: they return what they could read plus, when the text was
 * malformed, where reading stopped and why.
 */
export interface ParseError {
  /** Offset into the parsed string (UTF-16 code units) where the problem starts. */
  readonly offset: number;
  /** A sentence a person can act on. */
  readonly message: string;
}
