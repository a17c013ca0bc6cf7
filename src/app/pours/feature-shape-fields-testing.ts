import { MatChipListboxHarness } from '@angular/material/chips/testing';
import { DataFieldsHarness } from '../core/data-fields-testing';

/** The fields of `FeatureShapeFields` by their `data-field` names; only those of the chosen shape are there. */
export type FeatureShapeField = 'length' | 'width' | 'diameter' | 'area' | 'outline' | 'depth' | 'displaced' | 'waste';

/** Harness for `bt-feature-shape-fields`: the shape chips and the size fields of a water feature. */
export class FeatureShapeFieldsHarness extends DataFieldsHarness<FeatureShapeField> {
  static hostSelector = 'bt-feature-shape-fields';

  private readonly shapes = this.locatorFor(MatChipListboxHarness);

  /** Chooses a shape by the words on its chip ("Circle", "Traced outline"). */
  async chooseShape(label: string): Promise<void> {
    await (await this.shapes()).selectChips({ text: label });
  }

  /** The words on the selected shape chips. */
  async getSelectedShapes(): Promise<string[]> {
    const selected = await (await this.shapes()).getChips({ selected: true });
    return Promise.all(selected.map((chip) => chip.getText()));
  }
}
