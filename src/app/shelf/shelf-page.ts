import { BreakpointObserver, Breakpoints } from '@angular/cdk/layout';
import type { ComponentType } from '@angular/cdk/portal';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { DEFERENCE_NOTE } from '@benchtide/shared';
import { firstValueFrom, map, timer } from 'rxjs';
import { ContainerForm, type ContainerFormData } from './container-form';
import {
  containerRows,
  KIND_LABELS,
  localDay,
  measureLine,
  type ContainerRow,
  type MaterialStock,
} from './container-row';
import { ContainerTable, type ContainerAction } from './container-table';
import { MaterialForm, type MaterialFormData } from './material-form';
import { RemovalConfirm, type RemovalConfirmData } from './removal-confirm';
import { FIRST_CURRENCY, ShelfStock } from './shelf-stock';
import type { StockEntryData } from './stock-entry-data';
import { StocktakeForm } from './stocktake-form';
import { WasteForm } from './waste-form';

/** A material's section: its header words and the rows of its table. */
interface MaterialSection {
  readonly stock: MaterialStock;
  readonly kindText: string;
  /** A link to the safety data sheet, when it is one. */
  readonly sheetLink: string | null;
  readonly rows: ContainerRow[];
}

const WEB_ADDRESS = /^https?:\/\/\S+$/i;

/**
 * The Shelf: each material with its containers, what is left in each and when it goes off, and (for those
 * who may change it) adding, editing, wasting, counting and deleting. Everything reads and writes this
 * device's records, so the shelf works at the bench without a connection.
 */
@Component({
  selector: 'bt-shelf-page',
  imports: [RouterLink, MatButtonModule, MatIconModule, MatMenuModule, MatProgressBarModule, ContainerTable],
  templateUrl: './shelf-page.html',
  styleUrl: './shelf-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ShelfPage {
  private readonly stock = inject(ShelfStock);
  private readonly dialog = inject(MatDialog);
  private readonly breakpoints = inject(BreakpointObserver);

  protected readonly signedIn = this.stock.signedIn;
  protected readonly workshop = this.stock.workshop;
  protected readonly canWrite = this.stock.canWrite;
  protected readonly deference = DEFERENCE_NOTE;
  private readonly shelf = this.stock.shelf();
  /** Hourly, so "past use-by" turns up on a shelf left open overnight. */
  private readonly today = toSignal(timer(0, 3_600_000).pipe(map(() => localDay())), { initialValue: localDay() });
  protected readonly sections = computed<MaterialSection[] | null>(() => {
    const shelf = this.shelf();
    if (shelf === null) return null;
    const today = this.today();
    return shelf.map((stock) => ({
      stock,
      kindText: [KIND_LABELS[stock.material.kind], measureLine(stock.material)].filter(Boolean).join(' · '),
      sheetLink: WEB_ADDRESS.test(stock.material.safetySheet) ? stock.material.safetySheet : null,
      rows: containerRows(stock, today),
    }));
  });
  /** A new container starts in the currency of the one added last. */
  private readonly currency = computed(() => {
    const containers = (this.shelf() ?? []).flatMap((entry) => entry.containers.map((item) => item.container));
    const last = containers.reduce<(typeof containers)[number] | null>(
      (latest, container) => (latest && latest.createdAt >= container.createdAt ? latest : container),
      null,
    );
    return last?.currency ?? FIRST_CURRENCY;
  });
  protected readonly problem = signal<string | null>(null);

  protected addMaterial(): void {
    this.openForm<MaterialForm, MaterialFormData>(MaterialForm, { material: null });
  }

  protected editMaterial(section: MaterialSection): void {
    this.openForm<MaterialForm, MaterialFormData>(MaterialForm, { material: section.stock.material });
  }

  protected addContainer(section: MaterialSection): void {
    this.openForm<ContainerForm, ContainerFormData>(ContainerForm, {
      material: section.stock.material,
      container: null,
      currency: this.currency(),
    });
  }

  protected async deleteMaterial(section: MaterialSection): Promise<void> {
    const { material, containers } = section.stock;
    const count = containers.length;
    const held = count === 0 ? '' : ` Its ${count === 1 ? 'container goes' : `${count} containers go`} with it.`;
    const confirmed = await this.confirm({
      title: `Delete ${material.name}?`,
      text: `${material.name} comes off the shelf.${held} Pours already logged keep their amounts and costs.`,
    });
    if (confirmed) await this.run(() => this.stock.deleteMaterial(material.id));
  }

  protected async onAction(section: MaterialSection, { kind, row }: ContainerAction): Promise<void> {
    const { material } = section.stock;
    const entry: StockEntryData = { material, container: row.container, remainingQty: row.remainingQty };
    switch (kind) {
      case 'edit':
        this.openForm<ContainerForm, ContainerFormData>(ContainerForm, {
          material,
          container: row.container,
          currency: row.container.currency,
        });
        return;
      case 'waste':
        this.openForm<WasteForm, StockEntryData>(WasteForm, entry);
        return;
      case 'stocktake':
        this.openForm<StocktakeForm, StockEntryData>(StocktakeForm, entry);
        return;
      case 'delete': {
        const confirmed = await this.confirm({
          title: 'Delete this container?',
          text: `${row.partLabel} of ${material.name}, bought ${row.boughtOnText}${row.lot ? `, lot ${row.lot}` : ''}, with ${row.amountText} left, comes off the shelf. Pours already logged keep their amounts and costs.`,
        });
        if (confirmed) await this.run(() => this.stock.deleteContainer(row.container.id));
      }
    }
  }

  /** Full screen on a phone, so the keyboard never hides the field being typed in. */
  private openForm<C, D>(component: ComponentType<C>, data: D): void {
    this.problem.set(null);
    const phone = this.breakpoints.isMatched(Breakpoints.XSmall);
    this.dialog.open<C, D, boolean>(component, {
      data,
      width: phone ? '100vw' : '600px',
      maxWidth: '100vw',
      ...(phone ? { height: '100%', maxHeight: '100%' } : { maxHeight: '92vh' }),
    });
  }

  private async confirm(data: RemovalConfirmData): Promise<boolean> {
    this.problem.set(null);
    const ref = this.dialog.open<RemovalConfirm, RemovalConfirmData, boolean>(RemovalConfirm, {
      data,
      maxWidth: '480px',
      role: 'alertdialog',
    });
    return (await firstValueFrom(ref.afterClosed())) === true;
  }

  private async run(change: () => Promise<void>): Promise<void> {
    try {
      await change();
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : 'The shelf could not be changed on this device.');
    }
  }
}
