import {
  cureTimeline,
  followedMilestones,
  followPour,
  needsSanding,
  planPour,
  nextMilestone,
  pourMilestones,
  progressTowards,
  type CureDataSheet,
} from '../../shared/index.js';

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;
const START = Date.UTC(2026, 2, 14, 18, 0);

// Invented data sheet for tests only; not any maker's figures.
const sheet: CureDataSheet = {
  potLifeMin: 40,
  recoatMin: 360,
  recoatMaxMin: 1440,
  demouldMin: 1440,
  fullCureMin: 10_080,
  referenceTempC: 25,
  minCureTempC: 15,
  maxLayerMm: 6,
};

describe('pour milestones', () => {
  // Worked example by hand: at the reference temperature (25 °C, factor 1), three layers poured at
  // 18:00, then each at the earliest recoat 6 h later (00:00, 06:00); pot life 40 min after each;
  // recoat window closes 24 h after each; demould 24 h and full cure 7 days after the last layer.
  const three = pourMilestones(cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs: START, layerCount: 3 }));

  it('should list every moment of a three-layer pour in time order (worked example)', () => {
    expect(three.map((m) => [m.kind, m.layer ?? null, (m.atMs - START) / MINUTE])).toEqual([
      ['pot-life-ends', 1, 40],
      ['next-layer-due', 2, 360],
      ['pot-life-ends', 2, 400],
      ['next-layer-due', 3, 720],
      ['pot-life-ends', 3, 760],
      ['recoat-window-closes', 2, 1440],
      ['recoat-window-closes', 3, 1800],
      ['demould', null, 720 + 1440],
      ['full-cure', null, 720 + 10_080],
    ]);
  });

  it('should say which layer is which in the words shown', () => {
    expect(three[1]!.label).toBe('Layer 2 of 3 can go on');
    expect(three[0]!.label).toBe('Working time ends (layer 1 of 3)');
  });

  it('should have no next-layer moments for a single layer', () => {
    const one = pourMilestones(cureTimeline({ dataSheet: sheet, roomTempC: 25, startAtMs: START, layerCount: 1 }));

    expect(one.map((m) => m.kind)).toEqual(['pot-life-ends', 'demould', 'full-cure']);
    expect(one[0]!.label).toBe('Working time ends');
  });

  it('should halve every wait 10 °C warmer (10-degree rule, common practice)', () => {
    const warm = pourMilestones(cureTimeline({ dataSheet: sheet, roomTempC: 35, startAtMs: START, layerCount: 3 }));

    expect(warm.map((m) => m.atMs - START)).toEqual(three.map((m) => (m.atMs - START) / 2));
  });

  describe('nextMilestone', () => {
    it('should give the first moment still ahead, and null once fully cured', () => {
      expect(nextMilestone(three, START)?.kind).toBe('pot-life-ends');
      expect(nextMilestone(three, START + 40 * MINUTE)?.kind).toBe('next-layer-due');
      expect(nextMilestone(three, START + 5 * HOUR)?.label).toBe('Layer 2 of 3 can go on');
      expect(nextMilestone(three, START + 720 * MINUTE + 10_080 * MINUTE)).toBeNull();
    });
  });

  describe('progressTowards', () => {
    it('should measure from the moment before, or from the start for the first', () => {
      const first = three[0]!;
      const second = three[1]!;

      expect(progressTowards(three, first, START, START + 20 * MINUTE)).toBeCloseTo(0.5, 12);
      // From 40 min to 360 min: 200 min in is 160/320.
      expect(progressTowards(three, second, START, START + 200 * MINUTE)).toBeCloseTo(0.5, 12);
      expect(progressTowards(three, second, START, START)).toBe(0);
      expect(progressTowards(three, second, START, START + 999 * HOUR)).toBe(1);
    });
  });
});

describe('followedMilestones', () => {
  // Invented data sheet, times at 25 °C: recoat from 6 h until 12 h, demould 24 h, full cure 7 days.
  const plan = (() => {
    const result = planPour({
      shape: { kind: 'rectangle', lengthMm: 100, widthMm: 100 },
      depthMm: 12,
      material: {
        mixRatio: { basis: 'weight', partA: 2, partB: 1 },
        densityAGPerMl: 1.1,
        densityBGPerMl: 1.1,
        potLifeMin: 40,
        recoatMin: 360,
        recoatMaxMin: 720,
        demouldMin: 1440,
        fullCureMin: 10_080,
        referenceTempC: 25,
        minCureTempC: 15,
        maxLayerMm: 6,
      },
      roomTempC: 25,
      startAtMs: START,
      scaleResolutionG: 0.1,
    });
    if (!result.ok) throw new Error(JSON.stringify(result.errors));
    return result.plan;
  })();
  const layer = (number: number, pouredAtMs: number) => ({
    number,
    pouredAtMs,
    roomTempC: 25,
    depthMm: 6,
    partAG: plan.mix.perLayer.partAG,
    partBG: plan.mix.perLayer.partBG,
  });

  it('should mark what counts from a layer not yet on as projected, and nothing for a layer already on', () => {
    const one = followedMilestones(followPour({ plan, layerCount: 2, poured: [layer(1, START)] }));
    expect(one.map((m) => [m.kind, m.projected ?? false])).toEqual([
      ['layer-poured', false],
      ['pot-life-ends', false],
      ['next-layer-due', false],
      // Layer 2 projected at 6 h: its working time ends at 6 h 40, before the window closes at 12 h.
      ['pot-life-ends', true],
      ['recoat-window-closes', false],
      ['demould', true],
      ['full-cure', true],
    ]);
    const both = followedMilestones(
      followPour({ plan, layerCount: 2, poured: [layer(1, START), layer(2, START + 9 * HOUR)] }),
    );
    expect(both.some((m) => m.kind === 'next-layer-due')).toBeFalse();
    // Layer 2 three hours after its earliest time (worked by hand: planned at 6 h, poured at 9 h).
    expect(both.find((m) => m.kind === 'layer-poured' && m.layer === 2)?.plannedAtMs).toBe(START + 6 * HOUR);
    expect(both.find((m) => m.kind === 'demould')).toEqual(
      jasmine.objectContaining({ atMs: START + 33 * HOUR, plannedAtMs: START + 30 * HOUR }),
    );
  });

  it('should ask for sanding only once the recoat window has closed (common practice)', () => {
    const followed = followPour({ plan, layerCount: 2, poured: [layer(1, START)] });
    expect(needsSanding(followed, START + 12 * HOUR)).toBeFalse();
    expect(needsSanding(followed, START + 12 * HOUR + 1)).toBeTrue();
  });
});
