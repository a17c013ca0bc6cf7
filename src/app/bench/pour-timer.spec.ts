import { provideHttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, provideAppInitializer, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { BenchIcons } from '../core/bench-icons';
import { BENCH_DATA_SHEET, benchPour } from './bench-testing';
import { LayerRecorder, type LayerAtBench } from './layer-recorder';
import { PourTimer } from './pour-timer';

// The pour of bench-testing.ts: working time 40 min, recoat after 6 h, demould after 24 h and full cure after
// 72 h, all at 20 °C. The room is 20 °C too, so the times stand as printed (the 10-degree rule, common
// practice, gives a factor of 2^0 = 1). Three layers, planned each at the earliest recoat of the one before:
// layer 1 at 09:00, layer 2 at 15:00 (+360 min), layer 3 at 21:00 (+720 min); demould 24 h after the last
// layer (Wed 21:00) and full cure 72 h after it (Fri 21:00). 12 g of each part a layer.
const MINUTE = 60_000;
/** A Tuesday in June, in local time, far from any clock change. */
const START = new Date(2025, 5, 10, 9, 0).getTime();

function minutesAfterStart(minutes: number): number {
  return START + minutes * MINUTE;
}

@Component({
  imports: [PourTimer],
  template: `<bt-pour-timer [pour]="pour()" [now]="now()" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class TimerHost {
  readonly pour = signal(benchPour(START));
  readonly now = signal(START);
}

describe('PourTimer', () => {
  let fixture: ComponentFixture<TimerHost>;
  let recorded: LayerAtBench[];
  let refusal: string | null;

  beforeEach(() => {
    recorded = [];
    refusal = null;
    const recorder = {
      record: (layer: LayerAtBench) => {
        recorded.push(layer);
        return Promise.resolve(refusal);
      },
    };
    TestBed.configureTestingModule({
      imports: [TimerHost],
      providers: [
        provideHttpClient(),
        provideRouter([]),
        provideAppInitializer(() => inject(BenchIcons).register()),
        { provide: LayerRecorder, useValue: recorder },
      ],
    });
    fixture = TestBed.createComponent(TimerHost);
  });

  async function at(nowMs: number): Promise<void> {
    fixture.componentInstance.now.set(nowMs);
    await fixture.whenStable();
  }

  function query(selector: string): HTMLElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>(selector);
  }

  function text(selector: string): string {
    return (query(selector)?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  function countdown(): { left: string; until: string; at: string } {
    return { left: text('.countdown .left'), until: text('.countdown .until'), at: text('.countdown .at') };
  }

  function ringOffset(): number {
    return Number(query('circle.progress')?.getAttribute('stroke-dashoffset'));
  }

  function moments(): { label: string; time: string; passed: boolean }[] {
    return Array.from((fixture.nativeElement as HTMLElement).querySelectorAll('.moments li')).map((item) => ({
      label: item.querySelector('.label')?.textContent?.trim() ?? '',
      time: (item.querySelector('time')?.textContent ?? '').replace(/\s+/g, ' ').trim(),
      passed: item.classList.contains('passed') && (item.textContent ?? '').includes('(passed)'),
    }));
  }

  describe('the pour and its build', () => {
    it('should be named after the build, with the feature and the layer being poured', async () => {
      await at(minutesAfterStart(5));

      expect(text('h3')).toBe('Mill race');
      expect(query('h3 a')?.getAttribute('href')).toBe('/builds/build-1');
      expect(text('.what')).toBe('The mill pond · 1 of 3 layers on');
    });
  });

  describe('before the first layer', () => {
    it('should count down to the first layer going on', async () => {
      await at(START - 5 * MINUTE);

      expect(countdown()).toEqual({ left: '5:00', until: 'First layer goes on', at: 'at 09:00' });
      expect(query('.countdown .left')?.getAttribute('aria-label')).toBe('First layer goes on in 5:00');
    });

    it('should show the ring empty, nothing passed and nothing ready', async () => {
      await at(START - 5 * MINUTE);

      // A full dash offset is the whole circumference, 2π × 44 (geometry of the circle).
      expect(ringOffset()).toBeCloseTo(2 * Math.PI * 44, 6);
      expect(moments().some((moment) => moment.passed)).toBeFalse();
      expect(query('.now')).toBeNull();
    });
  });

  describe('between moments', () => {
    it('should count down to the end of the working time', async () => {
      await at(minutesAfterStart(30));

      // Worked example: 30 min after the start with 40 min of working time leaves 10 min: "10:00", at 09:40.
      expect(countdown()).toEqual({ left: '10:00', until: 'Working time ends (layer 1 of 3)', at: 'at 09:40' });
    });

    it('should count down to the next layer once the working time is over', async () => {
      await at(minutesAfterStart(100));

      // Worked example: layer 2 is due 360 min after the start; 100 min in, 260 min = 4 h 20 min are left.
      expect(countdown()).toEqual({ left: '4:20:00', until: 'Layer 2 of 3 can go on', at: 'at 15:00' });
      expect(query('.now')).toBeNull();
    });

    it('should round a part second up, so it never shows 0:00 before the moment', async () => {
      await at(minutesAfterStart(40) - 400);

      expect(countdown().left).toBe('0:01');
    });
  });

  describe('when a layer is due', () => {
    it('should say to pour the next layer now', async () => {
      await at(minutesAfterStart(361));

      expect(text('.now')).toBe('Ready: pour layer 2 of 3 now.');
      expect(query('.timer')?.classList).toContain('ready');
      expect(text('[data-action="layer-poured"]')).toBe('Layer 2 poured');
    });

    it('should offer no layer button before the layer below is firm enough', async () => {
      await at(minutesAfterStart(359));

      expect(query('[data-action="layer-poured"]')).toBeNull();
      expect(query('[data-action="poured-at"]')).toBeNull();
    });

    it('should say the same for the last layer once layer 2 is recorded', async () => {
      fixture.componentInstance.pour.set(benchPour(START, [{ number: 2, pouredAtMs: minutesAfterStart(360) }]));
      await at(minutesAfterStart(720));

      expect(text('.now')).toBe('Ready: pour layer 3 of 3 now.');
      expect(text('.what')).toBe('The mill pond · 2 of 3 layers on');
    });
  });

  describe('recording a layer', () => {
    it('should record the layer as poured now with one tap, in the room of the layer below', async () => {
      await at(minutesAfterStart(400));

      query('[data-action="layer-poured"]')!.click();
      await fixture.whenStable();

      expect(recorded).toEqual([{ pourId: 'pour-1', number: 2, pouredAtMs: minutesAfterStart(400), roomTempC: 20 }]);
    });

    it('should record an earlier time and another room from "Poured at…"', async () => {
      await at(minutesAfterStart(480));
      query('[data-action="poured-at"]')!.click();
      await fixture.whenStable();
      const time = query('input[name="pouredAt"]') as HTMLInputElement;
      // The chooser opens at now, 17:00.
      expect(time.value).toBe('17:00');

      time.value = '16:30';
      time.dispatchEvent(new Event('input'));
      const room = query('input[name="roomTempC"]') as HTMLInputElement;
      expect(room.value).toBe('20');
      room.value = '18,5';
      room.dispatchEvent(new Event('input'));
      await fixture.whenStable();
      expect(text('.said')).toBe('Layer 2 poured at 16:30, room at 18.5 °C.');
      query('[data-action="record-at"]')!.click();
      await fixture.whenStable();

      expect(recorded).toEqual([{ pourId: 'pour-1', number: 2, pouredAtMs: minutesAfterStart(450), roomTempC: 18.5 }]);
      expect(query('bt-layer-time-chooser')).toBeNull();
    });

    it('should keep the chooser open and show why, when the layer is refused', async () => {
      refusal = 'Layer 2 cannot go on before layer 1, which was poured at 09:00.';
      await at(minutesAfterStart(480));
      query('[data-action="poured-at"]')!.click();
      await fixture.whenStable();
      query('[data-action="record-at"]')!.click();
      await fixture.whenStable();

      expect(text('.refused')).toBe(refusal);
      expect(query('bt-layer-time-chooser')).not.toBeNull();
    });

    it('should re-time every moment from the real time, beside the planned one', async () => {
      fixture.componentInstance.pour.set(benchPour(START, [{ number: 2, pouredAtMs: minutesAfterStart(450) }]));
      await at(minutesAfterStart(460));

      // Layer 2 went on at 16:30, not 15:00: its working time ends at 17:10, layer 3 may go on at 22:30
      // (16:30 + 6 h), and demould and full cure count from layer 3 (22:30 + 24 h, + 72 h).
      expect(moments().map(({ label, time }) => `${label} ${time}`)).toEqual([
        'Layer 1 of 3 poured 09:00',
        'Working time ends (layer 1 of 3) 09:40',
        'Layer 2 of 3 poured 16:30, planned 15:00',
        'Working time ends (layer 2 of 3) 17:10',
        'Layer 3 of 3 can go on 22:30',
        'Working time ends (layer 3 of 3) 23:10 (estimate)',
        'Can be demoulded Wed 22:30, planned Wed 21:00 (estimate)',
        'Fully cured Fri 22:30, planned Fri 21:00 (estimate)',
      ]);
      expect(text('.estimate-note')).toContain('move when the layer they count from is recorded');
    });
  });

  describe('after the recoat window', () => {
    // The same resin with a recoat window of 12 h: layer 2 must go on by 21:00 or the surface be sanded.
    const windowed = { ...BENCH_DATA_SHEET, recoatMaxMin: 720 };

    it('should say plainly to sand the surface first, and still record the layer', async () => {
      fixture.componentInstance.pour.set(benchPour(START, [], windowed));
      await at(minutesAfterStart(780));

      expect(text('[data-notice="sand"]')).toBe(
        'The recoat window closed at 21:00: sand the surface first. Lightly key it all over with fine abrasive, ' +
          'wipe off the dust, then pour layer 2. Follow the data sheet where it says otherwise.',
      );
      expect(query('.now')).toBeNull();
      query('[data-action="layer-poured"]')!.click();
      await fixture.whenStable();
      expect(recorded.length).toBe(1);
    });

    it('should not ask for sanding while the window is open', async () => {
      fixture.componentInstance.pour.set(benchPour(START, [], windowed));
      await at(minutesAfterStart(700));

      expect(query('[data-notice="sand"]')).toBeNull();
    });
  });

  describe('weighing the next layer', () => {
    async function openWeigh(): Promise<void> {
      query('[data-action="weigh-layer"]')!.click();
      await fixture.whenStable();
    }
    async function type(name: string, value: string): Promise<void> {
      const input = query(`bt-weigh-view input[name="${name}"]`) as HTMLInputElement;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      await fixture.whenStable();
    }

    it("should show this layer's planned part A and part B", async () => {
      await at(minutesAfterStart(361));
      await openWeigh();

      expect(text('#weigh-title')).toBe('Weigh for layer 2 of 3');
      expect(text('[data-weigh="a"] .amount')).toBe('12 g');
      expect(text('[data-weigh="b"] .amount')).toBe('12 g');
    });

    it('should warn when the parts are off the ratio, and still record what was weighed', async () => {
      await at(minutesAfterStart(361));
      await openWeigh();

      await type('weighedAG', '12');
      await type('weighedBG', '13');
      // 13 g of B on 12 g of A, where 1:1 wants 12 g: 13 / 12 - 1 = 8.3 %, over the 5 % allowed.
      expect(text('[data-weigh="ratio"]')).toContain('8 % off the ratio');
      await type('weighedBG', '12.4');
      // 12.4 / 12 - 1 = 3.3 %: within 5 %.
      expect(query('[data-weigh="ratio"]')).toBeNull();
      await type('weighedBG', '13');
      query('[data-action="record-weighed"]')!.click();
      await fixture.whenStable();

      expect(recorded).toEqual([
        {
          pourId: 'pour-1',
          number: 2,
          pouredAtMs: minutesAfterStart(361),
          roomTempC: 20,
          weighedAG: 12,
          weighedBG: 13,
        },
      ]);
      expect(query('bt-weigh-view')).toBeNull();
    });

    it('should only show what to weigh before the layer may go on', async () => {
      await at(minutesAfterStart(100));
      await openWeigh();

      expect(text('[data-weigh="a"] .amount')).toBe('12 g');
      expect(query('[data-action="record-weighed"]')).toBeNull();
    });
  });

  describe('the moments ahead', () => {
    it('should list every moment with its time, the days ahead by weekday, estimates marked', async () => {
      await at(minutesAfterStart(30));

      expect(moments().map(({ label, time }) => `${label} ${time}`)).toEqual([
        'Layer 1 of 3 poured 09:00',
        'Working time ends (layer 1 of 3) 09:40',
        'Layer 2 of 3 can go on 15:00',
        'Working time ends (layer 2 of 3) 15:40 (estimate)',
        'Layer 3 of 3 can go on 21:00 (estimate)',
        'Working time ends (layer 3 of 3) 21:40 (estimate)',
        'Can be demoulded Wed 21:00 (estimate)',
        'Fully cured Fri 21:00 (estimate)',
      ]);
    });

    it('should mark the moments passed', async () => {
      await at(minutesAfterStart(361));

      expect(
        moments()
          .map((moment) => moment.passed)
          .slice(0, 4),
      ).toEqual([true, true, true, false]);
    });
  });

  describe('the ring', () => {
    it('should close as the wait goes by', async () => {
      await at(minutesAfterStart(10));
      const early = ringOffset();
      await at(minutesAfterStart(30));
      const later = ringOffset();

      expect(later).toBeLessThan(early);
      // 30 of the 40 min to the end of the working time have gone: a quarter of 2π × 44 is still open.
      expect(later).toBeCloseTo((2 * Math.PI * 44) / 4, 6);
    });

    it('should start again from empty for the next moment', async () => {
      await at(minutesAfterStart(39));
      const nearlyDone = ringOffset();
      await at(minutesAfterStart(41));

      expect(ringOffset()).toBeGreaterThan(nearlyDone);
    });
  });

  describe('after the full cure', () => {
    it('should say it is fully cured, with no countdown', async () => {
      const layers = [
        { number: 2, pouredAtMs: minutesAfterStart(360) },
        { number: 3, pouredAtMs: minutesAfterStart(720) },
      ];
      fixture.componentInstance.pour.set(benchPour(START, layers));
      await at(minutesAfterStart(720 + 4320) + 1000);

      expect(text('.done-line')).toBe('Fully cured: ready to handle and finish.');
      expect(query('.countdown')).toBeNull();
      expect(query('.now')).toBeNull();
      expect(query('[data-action="weigh-layer"]')).toBeNull();
      expect(query('.timer')?.classList).toContain('cured');
      expect(moments().every((moment) => moment.passed)).toBeTrue();
    });
  });
});
