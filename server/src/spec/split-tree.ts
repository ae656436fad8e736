// The cursor's tree for a wave spec read output by output (wave-fast.ts): a position in the
// outputs block is looked up in that one output's piece, parsed alone as the split read it; any
// other position in the frame. Nothing here parses the whole file, so a hover or a code lens
// costs the same however many outputs the file has.

import type { Segments } from './segments';
import { STANDALONE_PREFIX, standalone } from './output-cache';
import { type NodeAtCursor, type SyntaxTree, cursorTree, nodeInDocument, topLevelOf } from './syntax';

/** The piece holding `offset` (pieces are contiguous from headEnd to tailStart). */
function pieceAt(seg: Segments, offset: number): number {
  let lo = 0;
  let hi = seg.pieces.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (seg.pieces[mid].start <= offset) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

export function splitTree(seg: Segments): SyntaxTree {
  const gap = seg.tailStart - seg.headEnd;
  const frameToFile = (o: number): number => (o < seg.headEnd ? o : o + gap);
  const shifted = (at: NodeAtCursor | undefined, by: (o: number) => number): NodeAtCursor | undefined =>
    at && { ...at, start: by(at.start), end: by(at.end) };

  return {
    nodeAt(offset) {
      if (offset >= seg.headEnd && offset < seg.tailStart) {
        const piece = seg.pieces[pieceAt(seg, offset)];
        const own = standalone(piece);
        const at = nodeInDocument(cursorTree(own), own, offset - piece.start + STANDALONE_PREFIX.length);
        // `outputs:` itself is the frame's, and the line added after the piece is not in the file.
        if (!at || at.start < STANDALONE_PREFIX.length || at.end > STANDALONE_PREFIX.length + piece.text.length) return undefined;
        return shifted(at, (o) => o - STANDALONE_PREFIX.length + piece.start);
      }
      const local = offset < seg.headEnd ? offset : offset - gap;
      return shifted(nodeInDocument(cursorTree(seg.frameText), seg.frameText, local), frameToFile);
    },
    topLevel() {
      return topLevelOf(cursorTree(seg.frameText)).map((k) => ({
        key: k.key,
        start: frameToFile(k.start),
        end: frameToFile(k.end),
        // The outputs' value is the block the pieces fill.
        valueEnd: k.key === 'outputs' ? seg.tailStart : frameToFile(k.valueEnd),
      }));
    },
    // Every piece is an entry, one that does not parse alone or is half typed (`keyed: false`) too:
    // its key is its first line as written up to a colon, and it ends where its last line with content does.
    outputEntries() {
      return seg.pieces.map((piece) => {
        const first = piece.text.split(/[\r\n]/, 1)[0];
        const indent = first.length - first.trimStart().length;
        const start = piece.start + indent;
        const key = piece.keyed ? piece.name : first.slice(indent).replace(/:(?:\s.*)?$/, '').trimEnd().slice(0, 64);
        const end = start + key.length;
        return { key, start, end, valueEnd: Math.max(end, piece.start + piece.text.trimEnd().length) };
      });
    },
  };
}
