import {
  followPour,
  layerCountProblem,
  layerProblem,
  weighedRatioProblem,
  type PouredLayer,
} from '../../shared/pour-layers.js';
import { planPour, type PourPlan, type PourPlanRequestInput } from '../../shared/index.js';

// Invented data sheet for tests only; not any maker's figures.
const material: PourPlanRequestInput['material'] = {
  name: 'Test casting resin',
  mixRatio: { basis: 'weight', partA: 2, partB: 1 },
  densityAGPerMl: 1.15,
  densityBGPerMl: 0.95,
  potLifeMin: 40,
  recoatMin: 360,
  recoatMaxMin: 720,
  demouldMin: 1440,
  fullCureMin: 10_080,
  referenceTempC: 25,
  minCureTempC: 15,
  maxLayerMm: 6,
};

const at = (day: number, hour: number, minute = 0) => Date.UTC(2025, 0, day, hour, minute);
const HOUR = 3_600_000;

function planned(extra: Partial<PourPlanRequestInput> = {}): PourPlan {
  const result = planPour({
    shape: { kind: 'rectangle', lengthMm: 200, widthMm: 100 },
    depthMm: 18,
    material,
    roomTempC: 25,
    startAtMs: at(10, 9),
    scaleResolutionG: 0.1,
    ...extra,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.plan;
}

/** A poured layer to the plan's own amounts. */
function layer(plan: PourPlan, number: number, pouredAtMs: number, roomTempC = 25): PouredLayer {
  return {
    number,
    pouredAtMs,
    roomTempC,
    depthMm: plan.layers.layerDepthMm,
    partAG: plan.mix.perLayer.partAG,
    partBG: plan.mix.perLayer.partBG,
  };
}

describe('followPour', () => {
  // Worked by hand: 18 mm at most 6 mm a layer is 3 layers; at 25 °C (the data sheet's own temperature)
  // the recoat time is 6 h, so the plan has layers at 09:00, 15:00 and 21:00 on the 10th, demould 24 h
  // after the last (21:00 on the 11th) and full cure 7 days after it (21:00 on the 17th).
  const plan = planned();

  it('should follow the plan made at Start while only the first layer is on', () => {
    const followed = followPour({ plan, layerCount: 3, poured: [layer(plan, 1, at(10, 9))] });
    expect(followed.layers.map((each) => each.pourAtMs)).toEqual([at(10, 9), at(10, 15), at(10, 21)]);
    expect(followed.demouldAtMs).toBe(at(11, 21));
    expect(followed.fullCureAtMs).toBe(at(17, 21));
    expect(followed.next?.layer).toBe(2);
    expect(followed.needG).toEqual({ partA: plan.mix.total.partAG, partB: plan.mix.total.partBG });
  });

  it('should move every later moment by six hours when layer 2 goes on six hours late (worked by hand)', () => {
    // Layer 2 at 21:00 instead of 15:00, same 25 °C: layer 3 from 03:00 on the 11th, its window
    // closing 12 h after layer 2 (09:00 on the 11th), demould 03:00 on the 12th, full cure 03:00 on the 18th.
    const followed = followPour({
      plan,
      layerCount: 3,
      poured: [layer(plan, 1, at(10, 9)), layer(plan, 2, at(10, 21))],
    });
    const [first, second, third] = followed.layers;
    expect(first!.recoatFromMs).toBe(at(10, 15));
    expect(second!.pourAtMs).toBe(at(10, 21));
    expect(second!.plannedAtMs).toBe(at(10, 15));
    expect(second!.recoatUntilMs).toBe(at(11, 9));
    expect(third!.pourAtMs).toBe(at(11, 3));
    expect(third!.plannedAtMs).toBe(at(10, 21));
    expect(third!.poured).toBeFalse();
    expect(followed.demouldAtMs).toBe(at(12, 3));
    expect(followed.fullCureAtMs).toBe(at(18, 3));
    expect(followed.plannedDemouldAtMs).toBe(at(11, 21));
  });

  it('should stretch only the colder layer and what counts from it (worked by hand)', () => {
    // Layer 2 on time at 15:00 but the room at 15 °C: 10 °C colder doubles the times (common practice,
    // 2^((25 - 15) / 10) = 2), so its recoat is 12 h: layer 3 from 03:00 on the 11th. Layer 3 is projected
    // at the last known 15 °C: demould 48 h after it (03:00 on the 13th), full cure 14 days (03:00 on the 25th).
    const followed = followPour({
      plan,
      layerCount: 3,
      poured: [layer(plan, 1, at(10, 9)), layer(plan, 2, at(10, 15), 15)],
    });
    const [first, second, third] = followed.layers;
    expect(first!.potLifeEndsAtMs).toBe(at(10, 9, 40));
    expect(first!.recoatFromMs).toBe(at(10, 15));
    expect(second!.potLifeEndsAtMs).toBe(at(10, 16, 20));
    expect(second!.recoatFromMs).toBe(at(11, 3));
    expect(third!.pourAtMs).toBe(at(11, 3));
    expect(followed.demouldAtMs).toBe(at(13, 3));
    expect(followed.fullCureAtMs).toBe(at(25, 3));

    // Layer 3 then goes on at 25 °C again: demould 24 h after it, at 03:00 on the 12th.
    const warm = followPour({
      plan,
      layerCount: 3,
      poured: [layer(plan, 1, at(10, 9)), layer(plan, 2, at(10, 15), 15), layer(plan, 3, at(11, 3))],
    });
    expect(warm.next).toBeNull();
    expect(warm.demouldAtMs).toBe(at(12, 3));
  });

  it('should not project a layer still to come before now', () => {
    const followed = followPour({ plan, layerCount: 3, poured: [layer(plan, 1, at(10, 9))], nowMs: at(10, 18) });
    expect(followed.layers[1]!.pourAtMs).toBe(at(10, 18));
    expect(followed.layers[2]!.pourAtMs).toBe(at(11, 0));
  });

  it('should count what was really weighed in what the pour takes from the shelf', () => {
    const first = {
      ...layer(plan, 1, at(10, 9)),
      weighedAG: plan.mix.perLayer.partAG + 0.4,
      weighedBG: plan.mix.perLayer.partBG,
    };
    const followed = followPour({ plan, layerCount: 3, poured: [first] });
    expect(followed.needG.partA).toBeCloseTo(plan.mix.total.partAG + 0.4, 9);
    expect(followed.needG.partB).toBeCloseTo(plan.mix.total.partBG, 9);
  });

  it('should re-split the depth left over fewer layers when one is skipped, within the maximum (worked by hand)', () => {
    // 200 x 100 mm by 18 mm is 360 mL, 20 mL a millimetre. Planned as 5 layers of 3.6 mm (72 mL). After
    // layer 1, 14.4 mm (288 mL) is left; skipping a layer leaves 3 layers of 4.8 mm (96 mL each, under 6 mm).
    // At 2:1 by weight, densities 1.15 and 0.95, the mix weighs 1 / (2/3 / 1.15 + 1/3 / 0.95) = 1.07459 g/mL:
    // 96 mL is 103.161 g, part A 68.774 g (68.8 on a 0.1 g scale), part B 34.387 g (34.4).
    const five = planned({ layerCount: 5 });
    const first = layer(five, 1, at(10, 9));
    expect(first.depthMm).toBeCloseTo(3.6, 12);
    const followed = followPour({ plan: five, layerCount: 4, poured: [first] });
    const toCome = followed.layers.slice(1);
    expect(toCome.length).toBe(3);
    for (const each of toCome) {
      expect(each.planned.depthMm).toBeCloseTo(4.8, 12);
      expect(each.planned.partAG).toBeCloseTo(68.8, 9);
      expect(each.planned.partBG).toBeCloseTo(34.4, 9);
    }
    // Layer 1 keeps what it was poured to: 72 mL, 51.6 g and 25.8 g.
    expect(followed.layers[0]!.planned.partAG).toBeCloseTo(51.6, 9);
    expect(followed.needG.partA).toBeCloseTo(51.6 + 3 * 68.8, 9);
    expect(layerCountProblem(five, 4, [first])).toBeNull();
    // Skipping one more would leave 7.2 mm layers: refused, at least 4 in all (1 + ceil(14.4 / 6)).
    expect(layerCountProblem(five, 3, [first])).toContain('at least 4 layers');
  });

  it('should add a layer and split the depth left more thinly', () => {
    const followed = followPour({ plan, layerCount: 4, poured: [layer(plan, 1, at(10, 9))] });
    // 12 mm left over 3 layers: 4 mm each.
    expect(followed.layers.slice(1).map((each) => each.planned.depthMm)).toEqual([4, 4, 4]);
    expect(followed.layers[3]!.plannedAtMs).toBeUndefined();
  });

  it('should refuse fewer layers than are poured, and more than the cap', () => {
    const two = [layer(plan, 1, at(10, 9)), layer(plan, 2, at(10, 15))];
    expect(layerCountProblem(plan, 1, two)).toContain('already poured');
    expect(layerCountProblem(plan, 51, two)).toContain('at most 50');
    expect(() => followPour({ plan, layerCount: 1, poured: two })).toThrowError(RangeError);
  });
});

describe('layerProblem', () => {
  const plan = planned();
  const followed = followPour({ plan, layerCount: 3, poured: [layer(plan, 1, at(10, 9))] });
  const now = at(10, 16);

  it('should take the next layer at a time after the one below and not far ahead', () => {
    expect(layerProblem(followed, { number: 2, pouredAtMs: at(10, 15, 30) }, now)).toBeNull();
    expect(layerProblem(followed, { number: 2, pouredAtMs: now + HOUR }, now)).toBeNull();
  });

  it('should refuse each wrong layer in plain words', () => {
    expect(layerProblem(followed, { number: 1, pouredAtMs: now }, now)?.code).toBe('already-poured');
    expect(layerProblem(followed, { number: 3, pouredAtMs: now }, now)?.message).toBe('Layer 2 comes before layer 3.');
    expect(layerProblem(followed, { number: 4, pouredAtMs: now }, now)?.code).toBe('beyond-plan');
    expect(layerProblem(followed, { number: 2, pouredAtMs: at(10, 8) }, now)?.message).toBe(
      'Layer 2 cannot go on before layer 1, which was poured at 2025-01-10 09:00 UTC.',
    );
    expect(layerProblem(followed, { number: 2, pouredAtMs: now + HOUR + 60_000 }, now)?.field).toBe('pouredAt');
  });
});

describe('weighedRatioProblem', () => {
  const plan = planned();

  it('should let a weighing within 5 % of the ratio pass when the data sheet gives no tolerance (common practice)', () => {
    // 2:1 by weight: 50 g of part A wants 25 g of part B; 26 g is 4 % over.
    expect(weighedRatioProblem(plan, { partAG: 50, partBG: 26 })).toBeNull();
  });

  it('should say how far off and what part A wants when over the tolerance', () => {
    // 27 g of part B on 50 g of part A is 8 % over.
    expect(weighedRatioProblem(plan, { partAG: 50, partBG: 27 })).toContain('8 % off the ratio');
    expect(weighedRatioProblem(plan, { partAG: 50, partBG: 27 })).toContain('part A wants 25 g of part B');
  });

  it("should use the data sheet's own tolerance when it gives one", () => {
    const strict = planned({ material: { ...material, ratioTolerancePercent: 3 } });
    expect(weighedRatioProblem(strict, { partAG: 50, partBG: 26 })).toContain('allows 3 %');
  });
});
