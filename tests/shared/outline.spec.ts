import { allOnOneLine, crossingMessage, outlineCrossing } from '../../shared/outline.js';
import { pourShapeSchema } from '../../shared/schemas.js';

const p = (xMm: number, yMm: number) => ({ xMm, yMm });
const messagesFor = (points: { xMm: number; yMm: number }[]) => {
  const parsed = pourShapeSchema.safeParse({ kind: 'polygon', points });
  return parsed.success ? [] : parsed.error.issues.map((issue) => issue.message);
};

/** Points round a centre at increasing angles: simple by construction, whatever the radii (worked by hand). */
function starOutline(count: number, seed: number) {
  let state = seed;
  const random = () => (state = (state * 1_103_515_245 + 12_345) % 2 ** 31) / 2 ** 31;
  return Array.from({ length: count }, (_, index) => {
    const angle = (2 * Math.PI * index) / count;
    const radius = 20 + 80 * random();
    return p(radius * Math.cos(angle), radius * Math.sin(angle));
  });
}

describe('a traced outline that crosses itself', () => {
  it('should refuse a figure-eight, whose shoelace sum cancels to 0, with its own words naming the edges', () => {
    // Worked by hand: (0,0) (10,10) (10,0) (0,10) is a bow tie; its diagonals cross at (5,5) and the
    // shoelace terms 0 - 100 + 100 + 0 sum to 0, which is not its area (two triangles of 25 mm²).
    const bowTie = [p(0, 0), p(10, 10), p(10, 0), p(0, 10)];
    expect(outlineCrossing(bowTie)).toEqual({ firstEdge: { from: 1, to: 2 }, secondEdge: { from: 3, to: 4 } });
    expect(messagesFor(bowTie)).toEqual([
      'The traced outline crosses itself: the edge from point 1 to point 2 meets the edge from point 3 to point 4. ' +
        "Trace once round the water's edge without crossing.",
    ]);
  });

  it('should keep the words for points on one line', () => {
    const line = [p(0, 0), p(1, 1), p(2, 2), p(3, 3)];
    expect(allOnOneLine(line)).toBeTrue();
    expect(messagesFor(line)).toEqual(['The traced outline has no area: its points lie on one line']);
  });

  it('should judge a point a hair off an edge exactly: 1e-9 mm clear is simple, on the edge is touching', () => {
    const clear = [p(0, 0), p(10, 0), p(10, 10), p(5, 1e-9), p(0, 10)];
    expect(outlineCrossing(clear)).toBeNull();
    const touching = [p(0, 0), p(10, 0), p(10, 10), p(5, 0), p(0, 10)];
    expect(outlineCrossing(touching)).toEqual({ firstEdge: { from: 1, to: 2 }, secondEdge: { from: 3, to: 4 } });
  });

  it('should take a point tapped twice in a row as one point', () => {
    const square = [p(0, 0), p(10, 0), p(10, 0), p(10, 10), p(0, 10)];
    expect(outlineCrossing(square)).toBeNull();
    expect(messagesFor(square)).toEqual([]);
  });

  it('should refuse an edge folding back along the one before it', () => {
    // (0,0) (10,0) (5,0) (5,5): the second edge runs back over the first.
    expect(outlineCrossing([p(0, 0), p(10, 0), p(5, 0), p(5, 5)])).not.toBeNull();
  });

  it('should find a crossing made by swapping two corners of a pentagon (diagonals of a convex pentagon cross)', () => {
    const pentagon = [0, 1, 2, 3, 4].map((k) => p(Math.cos((2 * Math.PI * k) / 5), Math.sin((2 * Math.PI * k) / 5)));
    expect(outlineCrossing(pentagon)).toBeNull();
    const swapped = [pentagon[0]!, pentagon[3]!, pentagon[2]!, pentagon[1]!, pentagon[4]!];
    expect(outlineCrossing(swapped)).not.toBeNull();
  });

  it('should pass outlines that are simple by construction, up to the 10000 points allowed', () => {
    for (const seed of [1, 2, 3, 4, 5]) expect(outlineCrossing(starOutline(200, seed))).toBeNull();
    expect(outlineCrossing(starOutline(10_000, 7))).toBeNull();
  });

  it('should say which edges in the words', () => {
    expect(crossingMessage({ firstEdge: { from: 2, to: 3 }, secondEdge: { from: 7, to: 1 } })).toContain(
      'the edge from point 2 to point 3 meets the edge from point 7 to point 1',
    );
  });
});
