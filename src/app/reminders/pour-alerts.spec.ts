import { signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { PourMilestone } from '@benchtide/shared';
import { BenchToday, type PourOnBench } from '../bench/bench-today';
import { PourAlertBanner } from './pour-alert-banner';
import { PourAlerts } from './pour-alerts';

function pourWith(id: string, milestones: PourMilestone[]): PourOnBench {
  return {
    id,
    buildId: 'build-weir',
    buildName: 'Weir at Holm',
    materialName: 'Clear casting resin',
    note: 'Tail race',
    startMs: Date.now() - 60_000,
    layerCount: 2,
    milestones,
    mix: {} as PourOnBench['mix'],
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

  const soon = (ms: number) => Date.now() + ms;

  it('should show the moment a layer comes due while the app is open, leading to the pour', async () => {
    pours.set([
      pourWith('pour-1', [
        { kind: 'pot-life-ends', atMs: soon(20), layer: 1, label: 'Working time ends (layer 1 of 2)' },
        { kind: 'next-layer-due', atMs: soon(150), layer: 2, label: 'Layer 2 of 2 can go on' },
        { kind: 'demould', atMs: soon(3_600_000), label: 'Can be demoulded' },
      ]),
    ]);
    await fixture.whenStable();
    const alerts = TestBed.inject(PourAlerts);
    // Working time running out is not a reminder: the modeller is at the bench.
    await new Promise((resolve) => setTimeout(resolve, 80));
    expect(alerts.current()).toBeNull();
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(alerts.current()).toEqual({
      tag: 'pour:pour-1:next-layer-due:2',
      title: 'Layer 2 of 2 can go on',
      body: jasmine.stringContaining('Tail race on Weir at Holm'),
      buildId: 'build-weir',
      pourId: 'pour-1',
    });
    await fixture.whenStable();
    const banner = fixture.nativeElement as HTMLElement;
    expect(banner.querySelector('[role="alert"]')?.textContent).toContain('Layer 2 of 2 can go on');
    expect(banner.querySelector('a')?.getAttribute('href')).toBe('/builds/build-weir?pour=pour-1');

    (banner.querySelector('button') as HTMLButtonElement).click();
    await fixture.whenStable();
    expect(banner.querySelector('[role="alert"]')).toBeNull();
  });

  it('should not raise moments that passed before the app was open', async () => {
    pours.set([pourWith('pour-2', [{ kind: 'demould', atMs: Date.now() - 1000, label: 'Can be demoulded' }])]);
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(TestBed.inject(PourAlerts).current()).toBeNull();
  });
});
