import { HttpErrorResponse } from '@angular/common/http';
import { computed, signal } from '@angular/core';
import type { AbstractControl, FormGroup } from '@angular/forms';
import type { ZodType } from 'zod';
import { apiError, type ApiProblem } from './api-error';

/**
 * One request sent on the modeller's say-so, from a form or a button. A request from a form is first checked
 * with the server's own schema, so a mistake is explained in the server's words without a round trip. What
 * the server answers goes under the fields it names and, as a whole, above the buttons.
 */
export class Submission {
  private readonly form: FormGroup | null;
  private readonly sendingState = signal(false);
  private readonly problemState = signal<ApiProblem | null>(null);
  private readonly attemptedState = signal(false);

  readonly sending = this.sendingState.asReadonly();
  readonly problem = this.problemState.asReadonly();
  /** The problem in plain words alone, for a form that shows no field list. */
  readonly problemText = computed(() => this.problemState()?.message ?? null);
  /** Whether saving was tried: a form shows its own checks' messages from then on. */
  readonly attempted = this.attemptedState.asReadonly();

  constructor(form: FormGroup | null = null) {
    this.form = form;
  }

  /** Sends `request` only when `schema` accepts it; says whether the server took it. */
  async checkAndSend<Request>(
    schema: ZodType<Request>,
    request: unknown,
    send: (checked: Request) => Promise<unknown>,
  ): Promise<boolean> {
    if (this.sendingState()) return false;
    const checked = schema.safeParse(request);
    if (!checked.success) {
      this.problemState.set(null);
      // The first message for a field is the one the server would send.
      const fields: Record<string, string> = {};
      for (const issue of checked.error.issues) fields[String(issue.path[0] ?? '')] ??= issue.message;
      this.show(fields, null);
      return false;
    }
    return this.send(() => send(checked.data));
  }

  /** Sends what has nothing typed to check (a button press); says whether the server took it. */
  async send(action: () => Promise<unknown>): Promise<boolean> {
    if (this.sendingState()) return false;
    this.problemState.set(null);
    this.sendingState.set(true);
    try {
      await action();
      return true;
    } catch (error) {
      if (!(error instanceof HttpErrorResponse)) throw error;
      const problem = apiError(error);
      this.show(problem.fields, problem);
      return false;
    } finally {
      this.sendingState.set(false);
    }
  }

  /**
   * A write on this device: refused in `refused`'s words while the form's own check finds mistakes, then
   * `write`, whose failure is said in `failed`'s words with nothing lost from the form. Says whether it saved.
   */
  async save(write: () => Promise<unknown>, words: { refused?: string | null; failed: string }): Promise<boolean> {
    this.attemptedState.set(true);
    this.problemState.set(null);
    if (words.refused) {
      this.problemState.set(plainProblem('invalid', words.refused));
      return false;
    }
    if (this.sendingState()) return false;
    this.sendingState.set(true);
    try {
      await write();
      return true;
    } catch (error) {
      this.problemState.set(plainProblem('device-storage', error instanceof Error ? error.message : words.failed));
      return false;
    } finally {
      this.sendingState.set(false);
    }
  }

  /** Forgets the last answer, when the screen moves on. */
  clear(): void {
    this.problemState.set(null);
  }

  private show(fields: Readonly<Record<string, string>>, problem: ApiProblem | null): void {
    const elsewhere: string[] = [];
    for (const [name, message] of Object.entries(fields)) {
      const control: AbstractControl | null = this.form?.get(name) ?? null;
      if (control === null) {
        elsewhere.push(message);
        continue;
      }
      // Cleared by the control's next edit, when its validators (none) run again.
      control.setErrors({ message });
      control.markAsTouched();
    }
    if (problem !== null) this.problemState.set(problem);
    else if (elsewhere.length > 0) {
      this.problemState.set({ code: 'invalid', message: elsewhere.join(' '), fields, retryAfterMinutes: null });
    }
  }
}

function plainProblem(code: string, message: string): ApiProblem {
  return { code, message, fields: {}, retryAfterMinutes: null };
}

/** The message a Submission put on a control, for its `mat-error`. */
export function fieldMessage(control: AbstractControl): string {
  const message: unknown = control.errors?.['message'];
  return typeof message === 'string' ? message : '';
}
