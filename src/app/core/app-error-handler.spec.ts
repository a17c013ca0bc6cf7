import { ChangeDetectionStrategy, Component, ErrorHandler } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { appConfig } from '../app.config';
import { AppErrorHandler, ERROR_NOTICE, NOTICE_QUIET_MS, provideAppErrorHandler } from './app-error-handler';

@Component({
  selector: 'bt-broken-button',
  template: `<button type="button" (click)="tap()">Mix</button>`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class BrokenButton {
  tap(): void {
    throw new Error('the mix lost its part B');
  }
}

describe('AppErrorHandler', () => {
  let now: number;
  let open: jasmine.Spy;
  let logged: jasmine.Spy;

  beforeEach(() => {
    now = Date.UTC(2026, 9, 1, 9, 0);
    spyOn(Date, 'now').and.callFake(() => now);
    logged = spyOn(console, 'error');
    open = spyOn(MatSnackBar.prototype, 'open').and.callThrough();
    TestBed.configureTestingModule({ providers: [provideAppErrorHandler()], rethrowApplicationErrors: false });
  });

  afterEach(() => TestBed.inject(MatSnackBar).dismiss());

  /** The notice on screen, once the snack bar has loaded and opened. */
  async function shownNotice(): Promise<string> {
    for (let tries = 0; tries < 100; tries += 1) {
      const label = document.querySelector('.mat-mdc-snack-bar-label');
      if (label?.textContent?.trim()) return label.textContent.trim();
      await new Promise((resolve) => setTimeout(resolve, 20));
    }
    throw new Error('no notice was shown');
  }

  /** Long enough for a notice being loaded to have opened, had there been one. */
  const settle = () => new Promise((resolve) => setTimeout(resolve, 100));

  it('should be the error handler the app is given', () => {
    expect(appConfig.providers).toContain(provideAppErrorHandler());
  });

  it('should log an error thrown in a screen and tell the modeller in plain words', async () => {
    const fixture = TestBed.createComponent(BrokenButton);
    await fixture.whenStable();

    (fixture.nativeElement as HTMLElement).querySelector('button')!.click();

    expect(await shownNotice()).toBe(ERROR_NOTICE);
    expect(logged).toHaveBeenCalledWith('ERROR', jasmine.objectContaining({ message: 'the mix lost its part B' }));
  });

  it('should show one notice for errors that come within the quiet time', async () => {
    const handler = TestBed.inject(ErrorHandler);
    expect(handler).toBeInstanceOf(AppErrorHandler);

    handler.handleError(new Error('the layer list has no pour'));
    await shownNotice();
    now += NOTICE_QUIET_MS - 1;
    handler.handleError(new TypeError('cannot read the depth of undefined'));
    await settle();

    expect(open).toHaveBeenCalledTimes(1);
    expect(logged).toHaveBeenCalledTimes(2);
  });

  it('should notice a new error after the quiet time, but not one already noticed', async () => {
    const handler = TestBed.inject(ErrorHandler);
    handler.handleError(new Error('the sync stopped halfway'));
    await shownNotice();

    now += NOTICE_QUIET_MS;
    handler.handleError(new Error('the sync stopped halfway'));
    await settle();
    expect(open).toHaveBeenCalledTimes(1);
    handler.handleError(new Error('the photo has no build'));
    await settle();

    expect(open).toHaveBeenCalledTimes(2);
    expect(logged).toHaveBeenCalledTimes(3);
  });
});
