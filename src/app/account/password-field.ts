import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { map, startWith, switchMap } from 'rxjs';
import { fieldMessage } from '../core/submission';

/** A password with a button to show what was typed: easier with gloves on and a small keyboard. */
@Component({
  selector: 'bt-password-field',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule],
  template: `
    <mat-form-field>
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        [type]="visible() ? 'text' : 'password'"
        [formControl]="control()"
        [attr.autocomplete]="autocomplete()"
        autocapitalize="off"
        spellcheck="false"
      />
      <button
        matIconButton
        matSuffix
        type="button"
        [attr.aria-label]="'Show ' + label().toLowerCase()"
        [attr.aria-pressed]="visible()"
        (click)="visible.set(!visible())"
      >
        <mat-icon [svgIcon]="visible() ? 'eye-off' : 'eye'" aria-hidden="true" />
      </button>
      @if (hint(); as hint) {
        <mat-hint>{{ hint }}</mat-hint>
      }
      <mat-error>{{ error() }}</mat-error>
    </mat-form-field>
  `,
  styles: `
    :host,
    mat-form-field {
      display: block;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PasswordField {
  readonly control = input.required<FormControl<string>>();
  readonly label = input('Password');
  readonly autocomplete = input.required<'current-password' | 'new-password'>();
  readonly hint = input<string>();

  protected readonly visible = signal(false);
  /** The form's submission sets the message from outside this view; the control's events bring it in. */
  protected readonly error = toSignal(
    toObservable(this.control).pipe(
      switchMap((control) =>
        control.events.pipe(
          startWith(null),
          map(() => fieldMessage(control)),
        ),
      ),
    ),
    { initialValue: '' },
  );
}
