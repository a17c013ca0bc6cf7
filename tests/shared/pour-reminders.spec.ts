import { followPour, type PouredLayer } from '../../shared/pour-layers.js';
import { planPour, type PourPlan, type PourPlanRequestInput } from '../../shared/index.js';
import { followedReminders } from '../../shared/pour-reminders.js';

// A data sheet of our own invention (demo-style numbers, not a real product): times at 24 °C.
const material: PourPlanRequestInput['material'] = {
  mixRatio: { basis: 'weight', partA: 2, partB: 1 },
  densityAGPerMl: 1.1,
  densityBGPerMl: 1.1,
  referenceTempC: 24,
  potLifeMin: 40,
  recoatMin: 360,
  recoatMaxMin: 1440,
  demouldMin: 1440,
  fullCureMin: 4320,
  minCureTempC: 15,
  maxLayerMm: 6,
};
const start = Date.parse('2026-12-02T18:00:00Z');
const minutes = (n: number) => n * 60_000;
const label = { buildName: 'Harbour at Skellan', feature: 'Inner basin' };

function planned(layers: number, roomTempC = 24): PourPlan {
  const result = planPour({
    shape: { kind: 'rectangle', lengthMm: 100, widthMm: 100 },
    depthMm: 6 * layers,
    material,
    roomTempC,
    startAtMs: start,
    scaleResolutionG: 0.1,
  });
  if (!result.ok) throw new Error(JSON.stringify(result.errors));
  return result.plan;
}

const poured = (plan: PourPlan, number: number, pouredAtMs: number, roomTempC = 24): PouredLayer => ({
  number,
  pouredAtMs,
  roomTempC,
  depthMm: plan.layers.layerDepthMm,
  partAG: plan.mix.perLayer.partAG,
  partBG: plan.mix.perLayer.partBG,
});

describe('the reminders a pour earns', () => {
  it('should remind of the next layer and its recoat window only, while the layers above it wait', () => {
    // At the reference temperature the corrected times are the data sheet's own (t = t_ref × 2^0).
    const plan = planned(3);
    const reminders = followedReminders(followPour({ plan, layerCount: 3, poured: [poured(plan, 1, start)] }), label);
    expect(reminders.map((r) => [r.key, r.dueAtMs])).toEqual([
      ['next-layer-due:2', start + minutes(360)],
      ['recoat-window-closes:2', start + minutes(1440)],
    ]);
    expect(reminders[0]!.title).toBe('Layer 2 of 3 can go on');
    expect(reminders[0]!.body).toContain('Inner basin on Harbour at Skellan');
    // 100 x 100 x 6 mm is 60 mL a layer; at 1.1 g/mL that is 66 g, 44 g of part A and 22 g of part B at 2:1.
    expect(reminders[0]!.body).toContain('Weigh 44 g of part A and 22 g of part B.');
    expect(reminders[1]!.body).toContain('sand the surface');
  });

  it('should re-time from the real layers and send none for a layer already poured', () => {
    const plan = planned(3);
    const late = start + minutes(600);
    const followed = followPour({ plan, layerCount: 3, poured: [poured(plan, 1, start), poured(plan, 2, late)] });
    expect(followedReminders(followed, label).map((r) => [r.key, r.dueAtMs])).toEqual([
      ['next-layer-due:3', late + minutes(360)],
      ['recoat-window-closes:3', late + minutes(1440)],
    ]);
  });

  it('should remind of demould and full cure once every layer is on, counted from the last', () => {
    const plan = planned(2);
    const last = start + minutes(400);
    const followed = followPour({ plan, layerCount: 2, poured: [poured(plan, 1, start), poured(plan, 2, last)] });
    expect(followedReminders(followed, label).map((r) => [r.key, r.dueAtMs])).toEqual([
      ['demould', last + minutes(1440)],
      ['full-cure', last + minutes(4320)],
    ]);
  });

  it('should stretch with a colder room: 10 °C colder doubles each wait (rule of thumb, common practice)', () => {
    const plan = planned(1, 14);
    const reminders = followedReminders(followPour({ plan, layerCount: 1, poured: [poured(plan, 1, start, 14)] }), {
      buildName: 'Harbour at Skellan',
      feature: '',
    });
    // 14 °C is below the 15 °C minimum: the estimate is clamped to 15 °C, 2^(9/10) times the reference.
    const factor = 2 ** ((24 - 15) / 10);
    expect(reminders.map((r) => r.kind)).toEqual(['demould', 'full-cure']);
    expect(reminders[0]!.dueAtMs).toBeCloseTo(start + minutes(1440 * factor), -4);
    expect(reminders[1]!.body.startsWith('Harbour at Skellan has fully cured')).toBeTrue();
  });

  it('should give the same keys every time it is worked out for the same pour', () => {
    const plan = planned(2);
    const followed = followPour({ plan, layerCount: 2, poured: [poured(plan, 1, start)] });
    const once = followedReminders(followed, label).map((r) => r.key);
    expect(followedReminders(followed, label).map((r) => r.key)).toEqual(once);
    expect(new Set(once).size).toBe(once.length);
  });
});
