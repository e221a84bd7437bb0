/** The scenario's air boxes: boxes of space (engine/core/space.ts) that carry the name of what they belong to. */
import type { Box } from '../core/space.ts';

/** An air box, metres; tag = the section or branch name, a lining's tag, or "room". */
export interface TaggedBox extends Box {
  tag: string;
}

export function boundingBox(boxes: readonly Box[], tag: string): TaggedBox {
  return {
    x0: Math.min(...boxes.map((b) => b.x0)),
    x1: Math.max(...boxes.map((b) => b.x1)),
    y0: Math.min(...boxes.map((b) => b.y0)),
    y1: Math.max(...boxes.map((b) => b.y1)),
    z0: Math.min(...boxes.map((b) => b.z0)),
    z1: Math.max(...boxes.map((b) => b.z1)),
    tag,
  };
}
