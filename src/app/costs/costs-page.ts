import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatIconModule } from '@angular/material/icon';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { formatMoney, type CostLine } from '@benchtide/shared';
import { format } from 'date-fns';
import { AccountSession } from '../core/account-session';
import { Connectivity } from '../core/connectivity';
import { CostBook } from './cost-book';
import { CostChart } from './cost-chart';

interface CostTable {
  readonly id: string;
  readonly heading: string;
  readonly what: string;
  readonly amount: string;
  readonly lines: CostLine[];
  readonly links?: boolean;
  readonly note?: string;
}

/** What the workshop spent on material: per month and material as a chart, per build and per material as tables. */
@Component({
  selector: 'bt-costs-page',
  imports: [MatButtonModule, MatChipsModule, MatIconModule, MatTableModule, RouterLink, CostChart],
  templateUrl: './costs-page.html',
  styleUrl: './costs-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CostsPage {
  private readonly book = inject(CostBook);
  private readonly session = inject(AccountSession);

  protected readonly online = inject(Connectivity).online;
  protected readonly workshop = this.session.currentWorkshop;
  protected readonly costs = this.book.costs;
  protected readonly currencies = computed(() => this.costs().report.total.map((line) => line.currency));
  private readonly chosenCurrency = signal<string | null>(null);
  /** The currency shown: the one chosen, else the one with the most spent. */
  protected readonly currency = computed(() => {
    const totals = [...this.costs().report.total].sort((a, b) => b.costMinor - a.costMinor);
    const chosen = this.chosenCurrency();
    return totals.find((line) => line.currency === chosen)?.currency ?? totals[0]?.currency ?? null;
  });
  protected readonly total = computed(() => this.inCurrency(this.costs().report.total)[0] ?? null);
  protected readonly tables = computed<CostTable[]>(() => {
    const { byBuild, byMaterial, byMonth } = this.costs().report;
    return [
      {
        id: 'by-build',
        heading: 'By build',
        what: 'Build',
        amount: 'Cost',
        lines: this.inCurrency(byBuild),
        links: true,
        note: 'Waste is not charged to a build; it counts for its material and month.',
      },
      {
        id: 'by-material',
        heading: 'By material',
        what: 'Material',
        amount: 'Used and wasted',
        lines: this.inCurrency(byMaterial),
      },
      {
        id: 'by-month',
        heading: 'By month',
        what: 'Month',
        amount: 'Used and wasted',
        lines: this.inCurrency(byMonth),
      },
    ];
  });
  protected readonly cells = computed(() => this.costs().byMonthAndMaterial);
  protected readonly csvHref = computed(() => {
    const id = this.session.currentWorkshopId();
    return id === null ? null : `/api/workshops/${id}/costs.csv`;
  });
  protected readonly columns = ['label', 'cost'];

  protected chooseCurrency(currency: string): void {
    this.chosenCurrency.set(currency);
  }

  protected money(line: CostLine): string {
    return formatMoney(line.costMinor, line.currency);
  }

  protected month(line: CostLine): string {
    return format(`${line.key}-01T00:00:00`, 'MMMM yyyy');
  }

  private inCurrency(lines: readonly CostLine[]): CostLine[] {
    const currency = this.currency();
    return lines.filter((line) => line.currency === currency);
  }
}
