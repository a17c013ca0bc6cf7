/**
 * Checks on a traced outline before its area is trusted: the shoelace sum is the area only of an
 * outline whose edges do not cross (a figure-eight's halves cancel). Orientation is decided with
 * exact arithmetic (robust-predicates), so nearly-touching edges are judged right.
 */
import { orient2d } from 'robust-predicates';
import type { PointMm } from './pour-volume.js';

/** An edge by the points it joins, numbered from 1 as they were traced. */
export interface OutlineEdge {
  readonly from: number;
  readonly to: number;
}

/** Two edges that cross or touch. */
export interface OutlineCrossing {
  readonly firstEdge: OutlineEdge;
  readonly secondEdge: OutlineEdge;
}

const sign = (a: PointMm, b: PointMm, c: PointMm) => Math.sign(orient2d(a.xMm, a.yMm, b.xMm, b.yMm, c.xMm, c.yMm));

/** True when every point lies on one straight line (or all are the same point). */
export function allOnOneLine(points: readonly PointMm[]): boolean {
  const first = points[0];
  const other = points.find((point) => point.xMm !== first?.xMm || point.yMm !== first?.yMm);
  if (first === undefined || other === undefined) return true;
  return points.every((point) => sign(first, other, point) === 0);
}

function onSegment(a: PointMm, b: PointMm, p: PointMm): boolean {
  return (
    Math.min(a.xMm, b.xMm) <= p.xMm &&
    p.xMm <= Math.max(a.xMm, b.xMm) &&
    Math.min(a.yMm, b.yMm) <= p.yMm &&
    p.yMm <= Math.max(a.yMm, b.yMm)
  );
}

/** Whether segments ab and cd share any point (crossing, touching or overlapping). */
function segmentsMeet(a: PointMm, b: PointMm, c: PointMm, d: PointMm): boolean {
  const abc = sign(a, b, c);
  const abd = sign(a, b, d);
  const cda = sign(c, d, a);
  const cdb = sign(c, d, b);
  if (abc !== abd && cda !== cdb && abc * abd <= 0 && cda * cdb <= 0) {
    if (abc !== 0 || abd !== 0) return true;
  }
  return (
    (abc === 0 && onSegment(a, b, c)) ||
    (abd === 0 && onSegment(a, b, d)) ||
    (cda === 0 && onSegment(c, d, a)) ||
    (cdb === 0 && onSegment(c, d, b))
  );
}

/**
 * The first pair of edges that cross or touch, other than neighbours meeting at their shared point, or
 * null for a simple outline. Edges are swept in order of their left end, so only edges whose x ranges
 * overlap are compared.
 */
export function outlineCrossing(traced: readonly PointMm[]): OutlineCrossing | null {
  // A point tapped twice in a row is one point: it makes no edge.
  const kept = traced
    .map((point, index) => ({ point, number: index + 1 }))
    .filter(({ point }, index, all) => {
      const before = all[(index + all.length - 1) % all.length]!.point;
      return all.length === 1 || point.xMm !== before.xMm || point.yMm !== before.yMm;
    });
  const points = kept.map(({ point }) => point);
  const count = points.length;
  if (count < 4) return null;
  const edges = points.map((start, index) => {
    const end = points[(index + 1) % count]!;
    return { index, start, end, minX: Math.min(start.xMm, end.xMm), maxX: Math.max(start.xMm, end.xMm) };
  });
  const edgeAt = (index: number): OutlineEdge => ({ from: kept[index]!.number, to: kept[(index + 1) % count]!.number });
  const byLeft = [...edges].sort((a, b) => a.minX - b.minX);
  // The lowest-numbered pair is reported, whatever order the sweep meets them in.
  const best: { pair: readonly [number, number] | null } = { pair: null };
  const consider = (i: number, j: number) => {
    const pair = i < j ? ([i, j] as const) : ([j, i] as const);
    const found = best.pair;
    if (found === null || pair[0] < found[0] || (pair[0] === found[0] && pair[1] < found[1])) best.pair = pair;
  };
  for (let a = 0; a < byLeft.length; a += 1) {
    const first = byLeft[a]!;
    for (let b = a + 1; b < byLeft.length && byLeft[b]!.minX <= first.maxX; b += 1) {
      const second = byLeft[b]!;
      const gap = Math.abs(first.index - second.index);
      if (gap === 1 || gap === count - 1) {
        // Neighbours share one point; they only cross by folding back along each other.
        const shared =
          gap === 1
            ? first.index < second.index
              ? first.end
              : second.end
            : first.index === 0
              ? first.start
              : second.start;
        const far1 = first.start === shared ? first.end : first.start;
        const far2 = second.start === shared ? second.end : second.start;
        if (sign(shared, far1, far2) === 0 && (onSegment(shared, far1, far2) || onSegment(shared, far2, far1))) {
          consider(first.index, second.index);
        }
        continue;
      }
      if (segmentsMeet(first.start, first.end, second.start, second.end)) consider(first.index, second.index);
    }
  }
  if (best.pair === null) return null;
  const [low, high] = best.pair;
  return { firstEdge: edgeAt(low), secondEdge: edgeAt(high) };
}

/** Plain words for an outline whose edges cross. */
export function crossingMessage({ firstEdge, secondEdge }: OutlineCrossing): string {
  const edge = ({ from, to }: OutlineEdge) => `the edge from point ${from} to point ${to}`;
  return `The traced outline crosses itself: ${edge(firstEdge)} meets ${edge(secondEdge)}. Trace once round the water's edge without crossing.`;
}
