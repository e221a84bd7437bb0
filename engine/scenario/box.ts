/** The scenario's air boxes: boxes of space (engine/core/space.ts) that carry the name of what they belong to. */
import { boundsOf, type Box } from '../core/space.ts';

/** An air box, metres; tag = the section or branch name, a lining's tag, or "room". */
export interface TaggedBox extends Box {
  tag: string;
}

export function boundingBox(boxes: readonly Box[], tag: string): TaggedBox {
  return { ...boundsOf(boxes), tag };
}
