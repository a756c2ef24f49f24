/**
 * What the battery does about orders the auction did not accept (docs/design.md section 5):
 * - `follow-plan`: it runs its schedule anyway and closes every unaccepted order at the imbalance price;
 * - `follow-accepted`: it moves only with accepted orders; unaccepted orders have no effect.
 * A curve (a stack of limit orders) is always settled by what cleared: it has no schedule of its own.
 */
export type UnacceptedRule = 'follow-plan' | 'follow-accepted';

export const UNACCEPTED_RULES: readonly UnacceptedRule[] = Object.freeze(['follow-plan', 'follow-accepted']);
