import { signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { BenchToday, type PourOnBench } from '../bench/bench-today';
import { benchPour } from '../bench/bench-testing';
import { PourAlertBanner } from './pour-alert-banner';
import { PourAlerts, notificationOptions } from './pour-alerts';

const HOUR = 3_600_000;

/** The bench's three-layer pour (recoat from 6 h), started so that layer 2 comes due `inMs` from now. */
function pourDueIn(inMs: number): PourOnBench {
  return {
    ...benchPour(Date.now() - 6 * HOUR + inMs),
    buildId: 'build-weir',
    buildName: 'Weir at Holm',
    note: 'Tail race',
  };
}

describe('PourAlerts', () => {
  const pours = signal<PourOnBench[]>([]);
  let fixture: ComponentFixture<PourAlertBanner>;

  beforeEach(async () => {
    pours.set([]);
    TestBed.configureTestingModule({
      imports: [PourAlertBanner],
      providers: [provideRouter([]), { provide: BenchToday, useValue: { pours } }],
    });
    fixture = TestBed.createComponent(PourAlertBanner);
    await fixture.whenStable();
  });

  it('should show the moment a layer comes due while the app is open, leading to the pour', async () => {
    pours.set([pourDueIn(250)]);
    await fixture.whenStable();
    const alerts = TestBed.inject(PourAlerts);
    // Working time running out is not a reminder: the modeller is at the bench.
    await new Promise((resolve) => setTimeout(resolve, 80));
    expect(alerts.current()).toBeNull();
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(alerts.current()).toEqual({
      tag: 'pour:pour-1:next-layer-due:2',
      title: 'Layer 2 of 3 can go on',
      body: jasmine.stringContaining('Tail race on Weir at Holm'),
      buildId: 'build-weir',
      pourId: 'pour-1',
      layer: 2,
    });
    await fixture.whenStable();
    const banner = fixture.nativeElement as HTMLElement;
    expect(banner.querySelector('[role="alert"]')?.textContent).toContain('Layer 2 of 3 can go on');
    expect(banner.querySelector('a')?.getAttribute('href')).toBe('/builds/build-weir?pour=pour-1');

    (banner.querySelector('button') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(banner.querySelector('[role="alert"]')).toBeNull();
  });

  it('should not raise moments that passed before the app was open', async () => {
    pours.set([pourDueIn(-1000)]);
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(TestBed.inject(PourAlerts).current()).toBeNull();
  });

  it('should offer "Layer N poured" and "Weigh" on a layer\'s notification, each opening the bench at that layer', () => {
    const options = notificationOptions({
      tag: 't',
      title: 'Layer 2 of 3 can go on',
      body: '',
      buildId: 'b',
      pourId: 'p',
      layer: 2,
    });
    expect(options.actions).toEqual([
      { action: 'poured', title: 'Layer 2 poured' },
      { action: 'weigh', title: 'Weigh' },
    ]);
    const clicks = (options.data as { onActionClick: Record<string, { url: string }> }).onActionClick;
    expect(clicks['poured']?.url).toBe('/?pour=p&layer=2&act=poured');
    expect(clicks['weigh']?.url).toBe('/?pour=p&weigh=2');
    expect(clicks['default']?.url).toBe('/builds/b?pour=p');
    expect(
      notificationOptions({ tag: 't', title: 'Can be demoulded', body: '', buildId: 'b', pourId: 'p' }).actions,
    ).toBeUndefined();
  });
});
