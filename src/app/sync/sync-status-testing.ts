import { ComponentHarness } from '@angular/cdk/testing';
import { MatIconHarness } from '@angular/material/icon/testing';

/** Harness for `bt-sync-status`: the chip that says where this device stands with the server. */
export class SyncStatusHarness extends ComponentHarness {
  static hostSelector = 'bt-sync-status';

  private readonly chip = this.locatorFor('a.chip');
  private readonly label = this.locatorFor('.label');
  private readonly icon = this.locatorFor(MatIconHarness);

  /** The words on the chip ("Synced", "3 waiting", "Needs attention"). */
  async getLabel(): Promise<string> {
    return (await this.label()).text();
  }

  /** The name of the icon before the words ("done", "timer", "offline", "caution"). */
  async getIconName(): Promise<string | null> {
    return (await this.icon()).getName();
  }

  /** Whether the chip is drawn to catch the eye: a change or a photo was refused, or the session ended. */
  async needsAttention(): Promise<boolean> {
    return (await this.chip()).hasClass('attention');
  }

  /** How the words on the chip are announced when they change. */
  async getLabelLiveness(): Promise<string | null> {
    return (await this.label()).getAttribute('aria-live');
  }

  /** What a screen reader adds to the chip: what needs doing and when this device last synced. */
  async getDescription(): Promise<string> {
    const id = await (await this.chip()).getAttribute('aria-describedby');
    const description = await this.locatorForOptional(`[id="${id}"]`)();
    return description === null ? '' : description.text();
  }

  /** Where the chip leads. */
  async getLink(): Promise<string | null> {
    return (await this.chip()).getAttribute('href');
  }

  /** The chip's size on screen, in CSS pixels. */
  async getSize(): Promise<{ width: number; height: number }> {
    const { width, height } = await (await this.chip()).getDimensions();
    return { width, height };
  }
}
