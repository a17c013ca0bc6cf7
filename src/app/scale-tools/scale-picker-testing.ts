import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate } from '@angular/cdk/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

export interface ScalePickerHarnessFilters extends BaseHarnessFilters {
  /** The label over the list of scales ("Scale", "Larger scale"). */
  label?: string | RegExp;
}

/** Harness for `bt-scale-picker`: the list of standard scales and, for Other 1:N…, the typed ratio. */
export class ScalePickerHarness extends ComponentHarness {
  static hostSelector = 'bt-scale-picker';

  private readonly scaleField = this.locatorFor(MatFormFieldHarness);
  private readonly scaleSelect = this.locatorFor(MatSelectHarness);
  private readonly ratioInput = this.locatorForOptional(MatInputHarness);
  private readonly ratioError = this.locatorForOptional('[role="alert"]');

  static with(options: ScalePickerHarnessFilters = {}): HarnessPredicate<ScalePickerHarness> {
    return new HarnessPredicate(ScalePickerHarness, options).addOption('label', options.label, (harness, label) =>
      HarnessPredicate.stringMatches(harness.getLabel(), label),
    );
  }

  async getLabel(): Promise<string | null> {
    return (await this.scaleField()).getLabel();
  }

  /** The chosen entry as the list shows it ("HO · 1:87.1", "Other 1:N…"). */
  async getScaleText(): Promise<string> {
    return (await this.scaleSelect()).getValueText();
  }

  /** Chooses an entry of the list by its words. */
  async chooseScale(option: string): Promise<void> {
    await (await this.scaleSelect()).clickOptions({ text: option });
  }

  /** Where the chosen scale comes from, or that the ratio is the modeller's own. */
  async getHint(): Promise<string> {
    return (await (await this.scaleField()).getTextHints()).join(' ');
  }

  /** The typed N of 1:N; null while a standard scale is chosen and the field is not there. */
  async getRatio(): Promise<string | null> {
    const input = await this.ratioInput();
    return input === null ? null : input.getValue();
  }

  /** Types N of 1:N, key by key, after clearing the field; the field is there only for Other 1:N…. */
  async setRatio(text: string): Promise<void> {
    const input = await this.ratioInput();
    if (input === null) throw new Error('The ratio field shows only for Other 1:N…');
    await input.setValue(text);
  }

  /** The message under a ratio that cannot be read; null when there is none. */
  async getRatioError(): Promise<string | null> {
    const error = await this.ratioError();
    return error === null ? null : error.text();
  }
}
