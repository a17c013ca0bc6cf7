import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { findScale, type ScaleEntry } from '@benchtide/shared';
import { ScalePicker } from './scale-picker';
import { ScalePickerHarness } from './scale-picker-testing';

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
  let picker: ScalePickerHarness;

  beforeEach(async () => {
    TestBed.configureTestingModule({ imports: [Host] });
    fixture = TestBed.createComponent(Host);
    picker = await TestbedHarnessEnvironment.loader(fixture).getHarness(ScalePickerHarness);
  });

  function chosen(): ScaleEntry | null {
    return fixture.componentInstance.scale();
  }

  describe('standard scales', () => {
    it('should show the scale it is given, with its source', async () => {
      expect(await picker.getScaleText()).toBe('HO · 1:87.1');
      expect(await picker.getHint()).toBe('Source: NMRA S-1.2');
      expect(await picker.getRatio()).toBeNull();
    });

    it('should hand the chosen scale to its host', async () => {
      await picker.chooseScale('N · 1:160');

      expect(chosen()?.id).toBe('n');
      expect(chosen()?.ratio).toBe(160);
    });

    it('should offer figure scales by their ratio alone', async () => {
      await picker.chooseScale('1:35');

      expect(chosen()?.id).toBe('fig-35');
      expect(chosen()?.ratio).toBe(35);
    });

    it('should follow a scale set by its host', async () => {
      fixture.componentInstance.scale.set(findScale('oo')!);

      expect(await picker.getScaleText()).toBe('OO · 1:76.2');
      expect(await picker.getHint()).toBe('Source: common practice (British)');
    });
  });

  describe('Other 1:N…', () => {
    beforeEach(() => picker.chooseScale('Other 1:N…'));

    it('should start from the ratio chosen before', async () => {
      expect(await picker.getRatio()).toBe('87.1');
      expect(chosen()?.family).toBe('custom');
      expect(chosen()?.ratio).toBe(87.1);
      expect(await picker.getHint()).toBe('Your own ratio');
    });

    it('should hand the typed ratio to its host', async () => {
      await picker.setRatio('150');

      expect(chosen()?.ratio).toBe(150);
      expect(chosen()?.name).toBe('1:150');
      expect(await picker.getRatioError()).toBeNull();
    });

    it('should read a comma as the decimal point', async () => {
      await picker.setRatio('22,5');

      expect(chosen()?.ratio).toBe(22.5);
    });

    for (const invalid of ['0', '-5', 'abc', '']) {
      it(`should explain "${invalid}" in plain words and hand over no scale`, async () => {
        await picker.setRatio(invalid);

        expect(await picker.getRatioError()).toBe(RATIO_MESSAGE);
        expect(chosen()).toBeNull();
        expect(await picker.getRatio()).toBe(invalid);
      });
    }

    it('should take a readable ratio again after an unreadable one', async () => {
      await picker.setRatio('abc');
      await picker.setRatio('100');

      expect(await picker.getRatioError()).toBeNull();
      expect(chosen()?.ratio).toBe(100);
    });

    it('should drop the message and the field when a standard scale is chosen', async () => {
      await picker.setRatio('0');

      await picker.chooseScale('HO · 1:87.1');

      expect(await picker.getRatioError()).toBeNull();
      expect(await picker.getRatio()).toBeNull();
      expect(chosen()?.id).toBe('ho');
    });
  });
});
