/**
 * A caution attached to a result: a stable code for the screen and the server, and a
 * plain-language message the modeller can read at the bench.
 */
export interface TradeWarning<Code extends string = string> {
  readonly code: Code;
  readonly message: string;
}
