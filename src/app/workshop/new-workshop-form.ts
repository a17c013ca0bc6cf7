import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { workshopRequestSchema } from '@benchtide/shared';
import { ProblemNote } from '../core/problem-note';
import { fieldMessage, Submission } from '../core/submission';
import { Workshops } from './workshops';

@Component({
  selector: 'bt-new-workshop-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    ProblemNote,
  ],
  templateUrl: './new-workshop-form.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewWorkshopForm {
  private readonly workshops = inject(Workshops);
  private readonly formBuilder = inject(NonNullableFormBuilder);

  protected readonly form = this.formBuilder.group({ name: '' });
  protected readonly submission = new Submission(this.form);
  protected readonly fieldMessage = fieldMessage;

  protected async create(): Promise<void> {
    const created = await this.submission.checkAndSend(workshopRequestSchema, this.form.getRawValue(), (request) =>
      this.workshops.create(request),
    );
    if (created) this.form.reset();
  }
}
