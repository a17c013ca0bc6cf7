import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { DEFERENCE_NOTE, safetyCautions } from '@benchtide/shared';
import type { PourRecipe } from './pour-recipe';

export interface SheetHeader {
  readonly name: string;
  readonly scale: string;
  readonly status: string;
  readonly base: string | null;
  readonly real: string | null;
  readonly cost: string | null;
  readonly notes: string;
}

export interface SheetStep {
  readonly id: string;
  readonly at: string;
  readonly kind: string;
  readonly title: string;
  readonly notes: string;
}

/**
 * The build on paper, for a student who repeats it or a client who follows it: the build, the recipe of
 * every pour and the log. Shown only when printing; the screen shows the same facts in its own layout.
 */
@Component({
  selector: 'bt-build-sheet',
  templateUrl: './build-sheet.html',
  styleUrl: './build-sheet.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BuildSheet {
  readonly header = input.required<SheetHeader>();
  readonly recipes = input.required<readonly PourRecipe[]>();
  readonly steps = input.required<readonly SheetStep[]>();

  /** Oldest first, as the pours were done. */
  protected readonly inOrder = computed(() => [...this.recipes()].sort((a, b) => a.startAtMs - b.startAtMs));
  protected readonly cautions = computed(() => {
    const recipes = this.recipes();
    if (recipes.length === 0) return [];
    const resin = recipes.some((recipe) => recipe.materialKind === 'two-part-epoxy');
    const waterBased = recipes.some((recipe) => recipe.materialKind !== 'two-part-epoxy');
    const cautions = [
      ...(resin ? safetyCautions('two-part-epoxy') : []),
      ...(waterBased ? safetyCautions('single-part-medium') : []),
    ];
    return cautions.map((caution, index) => ({ key: `${caution.id}-${index}`, text: caution.text }));
  });
  protected readonly deference = DEFERENCE_NOTE;
}
