import {
  ChangeDetectionStrategy,
  Component,
  afterRenderEffect,
  computed,
  input,
  viewChild,
  type ElementRef,
} from '@angular/core';
import { formatMoney } from '@benchtide/shared';
import {
  BarController,
  BarElement,
  CategoryScale,
  Chart,
  Legend,
  LinearScale,
  Tooltip,
  type ChartConfiguration,
} from 'chart.js';
import { format } from 'date-fns';
import type { MonthMaterialCost } from './cost-book';

Chart.register(BarController, BarElement, CategoryScale, LinearScale, Legend, Tooltip);

/** Our own hues for materials, told apart by the legend and the table too, never by colour alone. */
const MATERIAL_HUES = ['#17606B', '#C98A1B', '#5B7F3A', '#7A4E8C', '#3F6FA8', '#A4563B', '#4E6470', '#B06C8E'];

/** Spending per month as stacked bars, one colour per material, in one currency. */
@Component({
  selector: 'bt-cost-chart',
  template: `<div class="frame"><canvas #canvas role="img" [attr.aria-label]="summary()"></canvas></div>`,
  styles: `
    .frame {
      position: relative;
      height: 280px;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CostChart {
  readonly cells = input.required<readonly MonthMaterialCost[]>();
  readonly currency = input.required<string>();

  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private chart: Chart<'bar'> | null = null;

  protected readonly summary = computed(() => {
    const months = new Set(this.cells().map((cell) => cell.month)).size;
    return `Spending per month over ${months} month${months === 1 ? '' : 's'}, stacked by material; the tables below give the figures.`;
  });

  constructor() {
    afterRenderEffect((onCleanup) => {
      const config = this.config();
      this.chart?.destroy();
      this.chart = new Chart(this.canvas().nativeElement, config);
      onCleanup(() => {
        this.chart?.destroy();
        this.chart = null;
      });
    });
  }

  private config(): ChartConfiguration<'bar'> {
    const currency = this.currency();
    const cells = this.cells().filter((cell) => cell.currency === currency);
    const months = [...new Set(cells.map((cell) => cell.month))].sort();
    const materials = [...new Map(cells.map((cell) => [cell.materialId, cell.materialName])).entries()];
    const text =
      getComputedStyle(document.documentElement).getPropertyValue('--mat-sys-on-surface').trim() || '#1b1b1b';
    return {
      type: 'bar',
      data: {
        labels: months.map((month) => format(`${month}-01T00:00:00`, 'MMM yyyy')),
        datasets: materials.map(([materialId, name], index) => ({
          label: name,
          backgroundColor: MATERIAL_HUES[index % MATERIAL_HUES.length],
          data: months.map(
            (month) => cells.find((cell) => cell.month === month && cell.materialId === materialId)?.costMinor ?? 0,
          ),
        })),
      },
      options: {
        responsive: true,
        maintainAspectRatio: false,
        animation: false,
        scales: {
          x: { stacked: true, ticks: { color: text } },
          // Minor units on the axis keep whole cents exact; formatMoney turns them into money.
          y: {
            stacked: true,
            ticks: { color: text, callback: (value) => formatMoney(Number(value), currency) },
            beginAtZero: true,
          },
        },
        plugins: {
          legend: { position: 'bottom', labels: { color: text } },
          tooltip: {
            callbacks: {
              label: (item) => `${item.dataset.label}: ${formatMoney(Number(item.raw) || 0, currency)}`,
            },
          },
        },
      },
    };
  }
}
