import { ComponentHarness, type TestElement } from '@angular/cdk/testing';
import { MatCardHarness } from '@angular/material/card/testing';

/** The figures of `PourPlanSheet` marked with `data-result`. */
export type PlanResult = 'to-mix' | 'layers' | 'mix-total' | 'cure-basis' | 'demould' | 'full-cure';

/** The rows of the amounts table. */
export type AmountsRow = 'part-a' | 'part-b';

/** Harness for `bt-pour-plan-sheet`: the plan, or what keeps it from being made, as the modeller reads it. */
export class PourPlanSheetHarness extends ComponentHarness {
  static hostSelector = 'bt-pour-plan-sheet';

  private readonly anyResult = this.locatorForOptional('[data-result]');
  private readonly toMixLabel = this.locatorFor('[data-result="to-mix"] .label');
  private readonly toMixVolume = this.locatorFor('[data-result="to-mix"] .value');
  private readonly toMixMass = this.locatorFor('[data-result="to-mix"] .aside');
  private readonly breakdown = this.locatorFor('.breakdown');
  private readonly layerNote = this.locatorFor('[data-result="layers"] + mat-card-subtitle');
  private readonly diagram = this.locatorFor('bt-layer-diagram svg');
  private readonly diagramLayers = this.locatorForAll('bt-layer-diagram rect.layer');
  private readonly mixCard = this.locatorFor(MatCardHarness.with({ selector: '.mix' }));
  private readonly layerMilestones = this.locatorForAll('.milestones li:not([data-result])');
  private readonly warnings = this.locatorForAll('[data-warning]');
  private readonly noPlanCard = this.locatorForOptional(MatCardHarness.with({ selector: '.invalid' }));
  private readonly problems = this.locatorForAll('.invalid li');
  private readonly cautions = this.locatorForAll('bt-pour-cautions [data-caution]');
  private readonly cautionNote = this.locatorFor('bt-pour-cautions .defer');

  /** A figure's words, spaces run together; null when the sheet does not show it. */
  async getResult(name: PlanResult): Promise<string | null> {
    const result = await this.locatorForOptional(`[data-result="${name}"]`)();
    return result === null ? null : words(result);
  }

  /** Whether any figure is shown: none are while a value makes no sense. */
  async hasResults(): Promise<boolean> {
    return (await this.anyResult()) !== null;
  }

  /** The "Mix in all" line: its label, the volume and the weight beside it. */
  async getToMix(): Promise<{ label: string; volume: string; mass: string }> {
    const [label, volume, mass] = await Promise.all([this.toMixLabel(), this.toMixVolume(), this.toMixMass()]);
    return { label: await words(label), volume: await words(volume), mass: await words(mass) };
  }

  /** How the volume to mix is worked out, from the surface to the extra for the cup. */
  async getBreakdown(): Promise<string> {
    return words(await this.breakdown());
  }

  /** The line under the layer count: the volume of each layer and the material's thickest layer. */
  async getLayerNote(): Promise<string> {
    return words(await this.layerNote());
  }

  /** What the side view of the layers says to a screen reader. */
  async getDiagramLabel(): Promise<string | null> {
    return (await this.diagram()).getAttribute('aria-label');
  }

  async getDiagramLayerCount(): Promise<number> {
    return (await this.diagramLayers()).length;
  }

  /** A row of the amounts for each layer: what, weigh, or measure; null when the table has no such row. */
  async getAmounts(row: AmountsRow): Promise<string[] | null> {
    const cells = await this.locatorForAll(`[data-result="${row}"] > *`)();
    if (cells.length === 0) return null;
    return Promise.all(cells.map((cell) => cell.text()));
  }

  /** The mix ratio over the amounts ("2 : 1 by volume", "single part"). */
  async getMixRatio(): Promise<string> {
    return (await this.mixCard()).getSubtitleText();
  }

  /** The timeline's entry for each layer, before demoulding and full cure. */
  async getLayerMilestones(): Promise<string[]> {
    return Promise.all((await this.layerMilestones()).map((milestone) => milestone.text()));
  }

  /** The codes of the warnings shown ("batch-too-small", "hot-room"...). */
  async getWarnings(): Promise<string[]> {
    const warnings = await this.warnings();
    return (await Promise.all(warnings.map((warning) => warning.getAttribute('data-warning')))).filter(
      (code): code is string => code !== null,
    );
  }

  /** The title of the card shown instead of the plan; null while there is a plan. */
  async getNoPlanTitle(): Promise<string | null> {
    const card = await this.noPlanCard();
    return card === null ? null : card.getTitleText();
  }

  /** What the card shown instead of the plan lists, one message a value. */
  async getProblems(): Promise<string[]> {
    return Promise.all((await this.problems()).map((problem) => problem.text()));
  }

  /** The ids of the cautions for the material ("foam", "gloves", "seal"...). */
  async getCautions(): Promise<string[]> {
    const cautions = await this.cautions();
    return (await Promise.all(cautions.map((caution) => caution.getAttribute('data-caution')))).filter(
      (id): id is string => id !== null,
    );
  }

  /** The line under the cautions that puts the maker's safety data sheet first. */
  async getCautionNote(): Promise<string> {
    return words(await this.cautionNote());
  }
}

async function words(element: TestElement): Promise<string> {
  return (await element.text()).replace(/\s+/g, ' ').trim();
}
