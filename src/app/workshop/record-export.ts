import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { EXPORT_TABLE_LABELS, type ExportTableName, type WorkshopView } from '@benchtide/shared';
import { Connectivity } from '../core/connectivity';

/** Downloads of a workshop's whole record, for its owners: one JSON file, or a CSV per table. */
@Component({
  selector: 'bt-record-export',
  imports: [MatCardModule, MatButtonModule],
  template: `
    <mat-card appearance="outlined">
      <mat-card-header><mat-card-title>Keep a copy of the record</mat-card-title></mat-card-header>
      <mat-card-content>
        <p>
          Everything this workshop has recorded on the server, deleted records included: a backup to keep, or your work
          to take elsewhere. Changes still waiting on a device go in once it has synced.
        </p>
        @if (online()) {
          <div class="bt-actions">
            <a matButton="outlined" data-export="json" [href]="base() + '/export.json'" [download]="fileName('json')"
              >Everything, as one JSON file</a
            >
          </div>
          <p>Or one table at a time, as CSV for a spreadsheet:</p>
          <ul class="tables">
            @for (table of tables; track table.name) {
              <li>
                <a
                  [attr.data-export]="table.name"
                  [href]="base() + '/export/' + table.name + '.csv'"
                  [download]="fileName(table.name + '.csv')"
                  >{{ table.label }}</a
                >
              </li>
            }
          </ul>
          <p class="hint">Photo files stay in the server's photo store; the photo records name them.</p>
        } @else {
          <p role="status">Downloading the record needs a connection to the server.</p>
        }
      </mat-card-content>
    </mat-card>
  `,
  styles: `
    .tables {
      display: flex;
      flex-wrap: wrap;
      gap: 4px 16px;
      margin: 0 0 8px;
      padding: 0;
      list-style: none;

      a {
        display: inline-flex;
        align-items: center;
        min-height: 48px;
      }
    }

    .hint {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RecordExport {
  readonly workshop = input.required<WorkshopView>();

  protected readonly online = inject(Connectivity).online;
  protected readonly tables = (Object.entries(EXPORT_TABLE_LABELS) as [ExportTableName, string][]).map(
    ([name, label]) => ({ name, label }),
  );
  protected readonly base = computed(() => `/api/workshops/${this.workshop().id}`);
  private readonly slug = computed(
    () =>
      this.workshop()
        .name.toLowerCase()
        .replace(/[^a-z0-9]+/g, '-')
        .replace(/^-|-$/g, '') || 'workshop',
  );

  protected fileName(what: string): string {
    return `benchtide-${this.slug()}-${what === 'json' ? 'record.json' : what}`;
  }
}
