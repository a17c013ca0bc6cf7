import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { WeighView } from './weigh-view';

@Component({
  imports: [WeighView],
  template: `@if (open()) {
    <bt-weigh-view [partA]="partA()" [partB]="partB()" [layerCount]="3" (closed)="open.set(false)" />
  }`,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
class Host {
  readonly open = signal(true);
  readonly partA = signal('84.2 g');
  readonly partB = signal<string | null>('42.1 g');
}

describe('WeighView', () => {
  let release: jasmine.Spy;
  let request: jasmine.Spy;

  beforeEach(() => {
    release = jasmine.createSpy('release').and.resolveTo();
    request = jasmine.createSpy('request').and.resolveTo({ release });
    Object.defineProperty(navigator, 'wakeLock', { value: { request }, configurable: true });
  });
  afterEach(() => {
    delete (navigator as { wakeLock?: unknown }).wakeLock;
  });

  async function render() {
    const fixture = TestBed.createComponent(Host);
    await fixture.whenStable();
    return fixture;
  }

  it('should show part A and part B alone in very large type, with the tare steps', async () => {
    const page = (await render()).nativeElement as HTMLElement;

    expect(page.querySelector('[data-weigh="a"] .amount')?.textContent).toBe('84.2 g');
    expect(page.querySelector('[data-weigh="b"] .amount')?.textContent).toBe('42.1 g');
    expect(page.textContent).toContain('Tare the cup');
    expect(page.textContent).toContain('Tare again');
    const size = parseFloat(getComputedStyle(page.querySelector('.amount')!).fontSize);
    expect(size).toBeGreaterThanOrEqual(56);
  });

  it('should show one amount, named Medium, for a single-part medium', async () => {
    const fixture = await render();
    fixture.componentInstance.partB.set(null);
    await fixture.whenStable();
    const page = fixture.nativeElement as HTMLElement;

    expect(page.querySelector('[data-weigh="b"]')).toBeNull();
    expect(page.querySelector('[data-weigh="a"] .name')?.textContent).toBe('Medium');
  });

  it('should keep the screen on while open and let it go when closed', async () => {
    const fixture = await render();
    await fixture.whenStable();

    expect(request).toHaveBeenCalledOnceWith('screen');
    expect(fixture.nativeElement.textContent).toContain('The screen stays on');

    (fixture.nativeElement.querySelector('button.done') as HTMLButtonElement).click();
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('bt-weigh-view')).toBeNull();
    expect(release).toHaveBeenCalled();
  });

  it('should close on Escape and take the focus to its button when it opens', async () => {
    const fixture = await render();

    expect(document.activeElement?.classList.contains('done')).toBeTrue();
    document.dispatchEvent(new KeyboardEvent('keydown', { key: 'Escape' }));
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('bt-weigh-view')).toBeNull();
  });

  it('should still show the amounts where the browser refuses to keep the screen on', async () => {
    request.and.rejectWith(new DOMException('Not allowed', 'NotAllowedError'));
    const fixture = await render();
    await fixture.whenStable();

    expect(fixture.nativeElement.querySelector('[data-weigh="a"]')).not.toBeNull();
    expect(fixture.nativeElement.textContent).not.toContain('The screen stays on');
  });
});
