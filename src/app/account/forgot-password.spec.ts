import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { inject, provideAppInitializer } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { provideRouter } from '@angular/router';
import { BenchIcons } from '../core/bench-icons';
import { ForgotPassword } from './forgot-password';

describe('ForgotPassword', () => {
  let fixture: ComponentFixture<ForgotPassword>;
  let loader: HarnessLoader;
  let http: HttpTestingController;

  beforeEach(async () => {
    localStorage.clear();
    TestBed.configureTestingModule({
      imports: [ForgotPassword],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        provideAppInitializer(() => inject(BenchIcons).register()),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ForgotPassword);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });
  afterEach(() => {
    http.verify();
    localStorage.clear();
  });

  async function ask(email: string): Promise<void> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'E-mail' }));
    await (await field.getControl(MatInputHarness))?.setValue(email);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Send the link' }))).click();
  }

  function text(selector: string): string {
    const element = (fixture.nativeElement as HTMLElement).querySelector(selector);
    return (element?.textContent ?? '').replace(/\s+/g, ' ').trim();
  }

  it('should send the address and show what the server says, whoever it belongs to', async () => {
    await ask('ada@example.org');
    const request = http.expectOne({ method: 'POST', url: '/api/auth/forgot' });
    request.flush(
      { message: 'If an account uses that address, a link is on its way.' },
      { status: 202, statusText: 'Accepted' },
    );
    await new Promise((resolve) => setTimeout(resolve));
    await fixture.whenStable();

    expect(request.request.body).toEqual({ email: 'ada@example.org' });
    expect(text('h1')).toBe('Check your e-mail');
    expect(text('[role="status"] p')).toBe('If an account uses that address, a link is on its way.');
  });

  it('should explain an address that cannot be one and send nothing', async () => {
    await ask('ada@');

    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: 'E-mail' }));
    expect(await field.getTextErrors()).toEqual(['Type an e-mail address like name@example.org']);
    http.expectNone('/api/auth/forgot');
  });
});
