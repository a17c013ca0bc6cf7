import { provideHttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, provideAppInitializer, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { cureTimeline, mixAmounts, pourMilestones, type CureDataSheet } from '@benchtide/shared';
import { BenchIcons } from '../core/bench-icons';
import type { PourOnBench } from './bench-today';
import { PourTimer } from './pour-timer';

// An invented data sheet, no maker's figures: working time 40 min, recoat after 6 h, demould after 24 h and
// full cure after 72 h, all at 20 °C. The room is 20 °C too, so the times stand as printed (the 10-degree rule,
// common practice, gives a factor of 2^0 = 1). Three layers, each on at the earliest recoat of the one before:
// layer 1 at 09:00, layer 2 at 15:00 (+360 min), layer 3 at 21:00 (+720 min); demould 24 h after the last
// layer (Wed 21:00) and full cure 72 h after it (Fri 21:00).
const DATA_SHEET: CureDataSheet = {
  potLifeMin: 40,
  recoatMin: 360,
  demouldMin: 1440,
  fullCureMin: 4320,
  referenceTempC: 20,
  minCureTempC: 15,
  maxLayerMm: 5,
};

const MINUTE = 60_000;
/** A Tuesday in June, in local time, far from any clock change. */
const START = new Date(2025, 5, 10, 9, 0).getTime();

function minutesAfterStart(minutes: number): number {
  return START + minutes * MINUTE;
}

function pourOnBench(): PourOnBench {
  const cure = cureTimeline({ dataSheet: DATA_SHEET, roomTempC: 20, startAtMs: START, layerCount: 3 });
  return {
    id: 'pour-1',
    buildId: 'build-1',
    buildName: 'Mill race',
    materialName: 'Clear casting resin',
    note: 'The mill pond',
    startMs: START,
    layerCount: 3,
    milestones: pourMilestones(cure),
    mix: mixAmounts({
      volumeMl: 60,
      ratio: { basis: 'weight', partA: 1, partB: 1 },
      densityAGPerMl: 1,
      densityBGPerMl: 1,
      layerCount: 3,
      scaleResolutionG: 0.1,
    }),
  };
}

@Component({
  imports: [PourTimer],
  template: `<bt-pour-timer [pour]="pour()" [now]="now()" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class TimerHost {
  readonly pour = signal(pourOnBench());
  readonly now = signal(START);
}

describe('PourTimer', () => {
  let fixture: ComponentFixture<TimerHost>;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [TimerHost],
      providers: [provideHttpClient(), provideRouter([]), provideAppInitializer(() => inject(BenchIcons).register())],
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
      time: item.querySelector('time')?.textContent?.trim() ?? '',
      passed: item.classList.contains('passed') && (item.textContent ?? '').includes('(passed)'),
    }));
  }

  describe('the pour and its build', () => {
    it('should be named after the build, with the feature and the layer being poured', async () => {
      await at(minutesAfterStart(5));

      expect(text('h3')).toBe('Mill race');
      expect(query('h3 a')?.getAttribute('href')).toBe('/builds/build-1');
      expect(text('.what')).toBe('The mill pond · layer 1 of 3');
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
      expect(text('.what')).toBe('The mill pond · layer 2 of 3');
      // Layer 2 went on at 15:00 and its own working time ends 40 min later, at 15:40: 39 min from 15:01.
      expect(countdown()).toEqual({ left: '39:00', until: 'Working time ends (layer 2 of 3)', at: 'at 15:40' });
    });

    it('should say the same for the last layer', async () => {
      await at(minutesAfterStart(720));

      expect(text('.now')).toBe('Ready: pour layer 3 of 3 now.');
    });
  });

  describe('the moments ahead', () => {
    it('should list every moment with its time, the days ahead by weekday', async () => {
      await at(minutesAfterStart(30));

      expect(moments().map(({ label, time }) => `${label} ${time}`)).toEqual([
        'Working time ends (layer 1 of 3) 09:40',
        'Layer 2 of 3 can go on 15:00',
        'Working time ends (layer 2 of 3) 15:40',
        'Layer 3 of 3 can go on 21:00',
        'Working time ends (layer 3 of 3) 21:40',
        'Can be demoulded Wed 21:00',
        'Fully cured Fri 21:00',
      ]);
    });

    it('should mark the moments passed', async () => {
      await at(minutesAfterStart(361));

      expect(moments().map((moment) => moment.passed)).toEqual([true, true, false, false, false, false, false]);
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
      await at(minutesAfterStart(720 + 4320) + 1000);

      expect(text('.done-line')).toBe('Fully cured: ready to handle and finish.');
      expect(query('.countdown')).toBeNull();
      expect(query('.now')).toBeNull();
      expect(query('.timer')?.classList).toContain('cured');
      expect(moments().every((moment) => moment.passed)).toBeTrue();
    });
  });
});
