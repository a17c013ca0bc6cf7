import { BreakpointObserver, Breakpoints } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  viewChild,
} from '@angular/core';
import { NgTemplateOutlet } from '@angular/common';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { map } from 'rxjs';
import { inputText } from '../core/decimal-input';
import type { ContainerRow } from './container-row';

export interface ContainerAction {
  readonly kind: 'edit' | 'waste' | 'stocktake' | 'delete';
  readonly row: ContainerRow;
}

/** From this many containers a material's table offers a filter. */
const FILTER_FROM = 6;
/** A page of containers; more than this and the table pages. */
const PAGE_SIZE = 10;

const WIDE_COLUMNS = ['part', 'boughtOn', 'lot', 'remaining', 'dates', 'price'];
/** On a phone the part, dates, lot and price stack in one cell beside what is left. */
const PHONE_COLUMNS = ['container', 'remaining'];

function sortValue(row: ContainerRow, column: string): string | number {
  switch (column) {
    case 'part':
      return row.partLabel;
    case 'lot':
      return row.lot.toLowerCase();
    case 'remaining':
      return row.remainingQty;
    case 'dates':
      // No use-by day sorts last: it keeps longest as far as anyone knows.
      return row.useBy ?? '9999-12-31';
    case 'price':
      return row.pricePerUnit;
    default:
      return row.boughtOn;
  }
}

/** A material's containers: what is left in each, when it goes off, what a unit of it cost. */
@Component({
  selector: 'bt-container-table',
  imports: [
    NgTemplateOutlet,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './container-table.html',
  styleUrl: './container-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ContainerTable {
  private readonly breakpoints = inject(BreakpointObserver);

  readonly rows = input.required<readonly ContainerRow[]>();
  /** Names the table and its controls for a screen reader. */
  readonly materialName = input.required<string>();
  readonly canWrite = input(false);
  readonly act = output<ContainerAction>();

  private readonly sort = viewChild.required(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  protected readonly dataSource = new MatTableDataSource<ContainerRow>([]);
  protected readonly pageSize = PAGE_SIZE;
  protected readonly filter = signal('');
  protected readonly phone = toSignal(
    this.breakpoints.observe(Breakpoints.XSmall).pipe(map((state) => state.matches)),
    {
      initialValue: false,
    },
  );
  protected readonly columns = computed(() => {
    const shown = this.phone() ? PHONE_COLUMNS : WIDE_COLUMNS;
    return this.canWrite() ? [...shown, 'actions'] : shown;
  });
  protected readonly filterable = computed(() => this.rows().length >= FILTER_FROM || this.filter() !== '');
  protected readonly paged = computed(() => this.rows().length > PAGE_SIZE);
  private readonly needle = computed(() => this.filter().trim().toLowerCase());
  protected readonly matching = computed(
    () => this.rows().filter((row) => row.filterText.includes(this.needle())).length,
  );

  constructor() {
    this.dataSource.filterPredicate = (row, needle) => row.filterText.includes(needle);
    this.dataSource.sortingDataAccessor = sortValue;
    effect(() => (this.dataSource.data = [...this.rows()]));
    effect(() => (this.dataSource.filter = this.needle()));
    effect(() => (this.dataSource.sort = this.sort()));
    effect(() => (this.dataSource.paginator = this.paginator() ?? null));
  }

  protected typeFilter(event: Event): void {
    this.filter.set(inputText(event));
  }

  protected describe(row: ContainerRow): string {
    return `${row.partLabel} bought ${row.boughtOnText}${row.lot ? `, lot ${row.lot}` : ''}`;
  }
}
