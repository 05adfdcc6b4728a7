// The shape of one way of describing a line (an entry of LINE_FORMS in lines.ts).
import type { LineRLGC } from '../../sim/model.js';
import type { Obj } from './read.js';

/**
 * What a form's builder returns: L' and C' at least; R' and G' when the form determines them itself
 * (added to any "r"/"g" keys); any further LineRLGC fields a form fills in are passed through.
 */
export type LineParams = Omit<LineRLGC, 'r' | 'g'> & { r?: number; g?: number };

export interface LineForm {
  /** Short name for messages: "z0+delay". */
  id: string;
  /** Keys that select this form; all must be present. */
  required: readonly string[];
  /** Further keys this form accepts (beyond "r" and "g"). */
  optional?: readonly string[];
  /** Whether the common loss keys "r" and "g" apply (default true). */
  losses?: boolean;
  /** An example of this form, for messages. */
  example: string;
  /** Read the form's keys from `o` (problems go through `o`); undefined when any is bad. */
  build(o: Obj): LineParams | undefined;
}
