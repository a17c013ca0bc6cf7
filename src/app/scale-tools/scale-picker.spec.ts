import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { findScale, type ScaleEntry } from '@benchtide/shared';
import { ScalePicker } from './scale-picker';

// HO 1:87.1 and N 1:160 by NMRA S-1.2; OO 1:76.2 by common British practice; the typed ratios are design examples.

const RATIO_MESSAGE = 'Type N of 1:N, a number above 0 (for example 100 for 1:100)';

@Component({
  imports: [ScalePicker],
  template: `<bt-scale-picker label="Scale" [(scale)]="scale" />`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly scale = signal<ScaleEntry | null>(findScale('ho')!);
}

describe('ScalePicker', () => {
  let fixture: ComponentFixture<Host>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [Host] });
    fixture = TestBed.createComponent(Host);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  function chosen(): ScaleEntry | null {
    return fixture.componentInstance.scale();
  }

  function ratioInput(): HTMLInputElement | null {
    return (fixture.nativeElement as HTMLElement).querySelector('input');
  }

  function alertText(): string | null {
    return (fixture.nativeElement as HTMLElement).querySelector('[role="alert"]')?.textContent?.trim() ?? null;
  }

  function hintText(): string {
    return (fixture.nativeElement as HTMLElement).querySelector('mat-hint')?.textContent?.trim() ?? '';
  }

  async function choose(option: string): Promise<void> {
    const select = await loader.getHarness(MatSelectHarness);
    await select.clickOptions({ text: option });
    await fixture.whenStable();
  }

  async function typeRatio(text: string): Promise<void> {
    const input = ratioInput();
    if (!input) throw new Error('No ratio field');
    input.value = text;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  describe('standard scales', () => {
    it('should show the scale it is given, with its source', async () => {
      const select = await loader.getHarness(MatSelectHarness);

      expect(await select.getValueText()).toBe('HO · 1:87.1');
      expect(hintText()).toBe('Source: NMRA S-1.2');
      expect(ratioInput()).toBeNull();
    });

    it('should hand the chosen scale to its host', async () => {
      await choose('N · 1:160');

      expect(chosen()?.id).toBe('n');
      expect(chosen()?.ratio).toBe(160);
    });

    it('should offer figure scales by their ratio alone', async () => {
      await choose('1:35');

      expect(chosen()?.id).toBe('fig-35');
      expect(chosen()?.ratio).toBe(35);
    });

    it('should follow a scale set by its host', async () => {
      fixture.componentInstance.scale.set(findScale('oo')!);
      await fixture.whenStable();
      const select = await loader.getHarness(MatSelectHarness);

      expect(await select.getValueText()).toBe('OO · 1:76.2');
      expect(hintText()).toBe('Source: common practice (British)');
    });
  });

  describe('Other 1:N…', () => {
    beforeEach(() => choose('Other 1:N…'));

    it('should start from the ratio chosen before', () => {
      expect(ratioInput()?.value).toBe('87.1');
      expect(chosen()?.family).toBe('custom');
      expect(chosen()?.ratio).toBe(87.1);
      expect(hintText()).toBe('Your own ratio');
    });

    it('should hand the typed ratio to its host', async () => {
      await typeRatio('150');

      expect(chosen()?.ratio).toBe(150);
      expect(chosen()?.name).toBe('1:150');
      expect(alertText()).toBeNull();
    });

    it('should read a comma as the decimal point', async () => {
      await typeRatio('22,5');

      expect(chosen()?.ratio).toBe(22.5);
    });

    for (const invalid of ['0', '-5', 'abc', '']) {
      it(`should explain "${invalid}" in plain words and hand over no scale`, async () => {
        await typeRatio(invalid);

        expect(alertText()).toBe(RATIO_MESSAGE);
        expect(chosen()).toBeNull();
        expect(ratioInput()?.value).toBe(invalid);
      });
    }

    it('should take a readable ratio again after an unreadable one', async () => {
      await typeRatio('abc');
      await typeRatio('100');

      expect(alertText()).toBeNull();
      expect(chosen()?.ratio).toBe(100);
    });

    it('should drop the message and the field when a standard scale is chosen', async () => {
      await typeRatio('0');

      await choose('HO · 1:87.1');

      expect(alertText()).toBeNull();
      expect(ratioInput()).toBeNull();
      expect(chosen()?.id).toBe('ho');
    });
  });
});
