import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { provideServiceWorker } from '@angular/service-worker';
import type { ReminderPreferences } from '@benchtide/shared';
import { ReminderSettings } from './reminder-settings';

const SAVED: ReminderPreferences = {
  kinds: ['next-layer-due', 'full-cure'],
  channels: ['email'],
  quietHours: { from: '21:30', until: '06:45' },
  timeZone: 'Europe/Dublin',
};

describe('ReminderSettings', () => {
  let fixture: ComponentFixture<ReminderSettings>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  async function open(answer: () => void): Promise<void> {
    TestBed.configureTestingModule({
      imports: [ReminderSettings],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideServiceWorker('ngsw-worker.js', { enabled: false }),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ReminderSettings);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
    answer();
    await settle();
  }

  afterEach(() => http.verify());

  /** Lets a promise that an answer resolved run on, then the screen catch up. */
  async function settle(): Promise<void> {
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();
  }

  it('should show the member’s saved choices', async () => {
    await open(() => http.expectOne('/api/account/reminders').flush({ preferences: SAVED, saved: true, devices: [] }));
    const checked = async (label: string) => (await loader.getHarness(MatCheckboxHarness.with({ label }))).isChecked();
    expect(await checked('The next layer of a pour can go on')).toBeTrue();
    expect(await checked('A pour can be demoulded')).toBeFalse();
    expect(await checked('An e-mail')).toBeTrue();
    expect(await checked('A notification on the devices below')).toBeFalse();
    const text = fixture.nativeElement.textContent as string;
    expect(text).toContain('None yet.');
    // The service worker is off here (as in a browser without it): say so instead of offering a button.
    expect(text).toContain('This browser cannot show notifications from Benchtide');
  });

  it('should save what the member ticks, with quiet hours off', async () => {
    await open(() => http.expectOne('/api/account/reminders').flush({ preferences: SAVED, saved: true, devices: [] }));
    await (await loader.getHarness(MatCheckboxHarness.with({ label: 'A pour can be demoulded' }))).check();
    await (await loader.getHarness(MatSlideToggleHarness.with({ label: 'Hold reminders overnight' }))).uncheck();
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save reminders' }))).click();
    const request = http.expectOne({ method: 'PUT', url: '/api/account/reminders' });
    expect(request.request.body).toEqual({
      kinds: ['next-layer-due', 'demould', 'full-cure'],
      channels: ['email'],
      quietHours: null,
      timeZone: 'Europe/Dublin',
      recoatLeadMin: 30,
    });
    request.flush({ ...SAVED, kinds: ['next-layer-due', 'demould', 'full-cure'], quietHours: null });
    await settle();
    expect(fixture.nativeElement.textContent).toContain('Saved');
  });

  it('should refuse an unknown time zone in plain words, without sending', async () => {
    await open(() => http.expectOne('/api/account/reminders').flush({ preferences: SAVED, saved: true, devices: [] }));
    const component = fixture.componentInstance as unknown as {
      form: { controls: { timeZone: { setValue(v: string): void } } };
    };
    component.form.controls.timeZone.setValue('Nowhere/Atlantis');
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save reminders' }))).click();
    await settle();
    http.expectNone('/api/account/reminders');
    expect(fixture.nativeElement.textContent).toContain('Choose a time zone from the list');
  });

  it('should count quiet hours in this device’s time zone until the member has chosen', async () => {
    await open(() =>
      http
        .expectOne('/api/account/reminders')
        .flush({ preferences: { ...SAVED, timeZone: 'Pacific/Chatham' }, saved: false, devices: [] }),
    );
    const component = fixture.componentInstance as unknown as { form: { controls: { timeZone: { value: string } } } };
    expect(component.form.controls.timeZone.value).toBe(Intl.DateTimeFormat().resolvedOptions().timeZone);
  });

  it('should warn when quiet hours would hold a recoat reminder past the window, and save the lead', async () => {
    await open(() =>
      http.expectOne('/api/account/reminders').flush({
        preferences: { ...SAVED, kinds: ['recoat-window-closes'], recoatLeadMin: 45 },
        saved: true,
        devices: [],
      }),
    );
    const host = fixture.nativeElement as HTMLElement;
    const lead = host.querySelector<HTMLInputElement>('[data-field="recoatLeadMin"]')!;
    expect(lead.value).toBe('45');
    // Worked by hand: quiet from 21:30, reminded 45 min before the close: windows closing 22:15–06:45 are missed.
    expect(host.querySelector('[data-notice="recoat-quiet"]')?.textContent).toContain('between 22:15 and 06:45');

    lead.value = '600';
    lead.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(host.querySelector('[data-notice="recoat-quiet"]')).toBeNull();

    lead.value = 'soon';
    lead.dispatchEvent(new Event('input'));
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save reminders' }))).click();
    await settle();
    http.expectNone('/api/account/reminders');
    expect(host.textContent).toContain('The recoat reminder lead must be a whole number of minutes');

    lead.value = '20';
    lead.dispatchEvent(new Event('input'));
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Save reminders' }))).click();
    const request = http.expectOne({ method: 'PUT', url: '/api/account/reminders' });
    expect(request.request.body.recoatLeadMin).toBe(20);
    request.flush({ ...SAVED, kinds: ['recoat-window-closes'], recoatLeadMin: 20 });
    await settle();
  });

  it('should say settings need a connection when they cannot be loaded', async () => {
    await open(() =>
      http.expectOne('/api/account/reminders').error(new ProgressEvent('error'), { status: 0, statusText: 'Offline' }),
    );
    expect(fixture.nativeElement.textContent).toContain('Reminder settings need a connection');
  });
});
