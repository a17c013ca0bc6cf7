import { signal } from '@angular/core';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { Connectivity } from '../core/connectivity';
import { PhotoThumb } from './photo-thumb';

describe('PhotoThumb', () => {
  const online = signal(true);
  let fixture: ComponentFixture<PhotoThumb>;

  beforeEach(async () => {
    online.set(true);
    TestBed.configureTestingModule({
      imports: [PhotoThumb],
      providers: [{ provide: Connectivity, useValue: { online } }],
    });
    fixture = TestBed.createComponent(PhotoThumb);
    fixture.componentRef.setInput('workshopId', 'w-1');
    fixture.componentRef.setInput('photoId', 'p-1');
    fixture.componentRef.setInput('alt', 'Photo of Weir, taken 1 Mar 2025');
    await fixture.whenStable();
  });

  const host = () => fixture.nativeElement as HTMLElement;

  it('should show the server’s copy, and say it is shown when online when it cannot be fetched', async () => {
    expect(host().querySelector('img')?.getAttribute('src')).toBe('/api/workshops/w-1/photos/p-1/thumb');
    host().querySelector('img')!.dispatchEvent(new Event('error'));
    await fixture.whenStable();
    expect(host().querySelector('img')).toBeNull();
    expect(host().querySelector('[role="img"]')?.getAttribute('aria-label')).toBe(
      'Photo of Weir, taken 1 Mar 2025 (shown when online)',
    );
  });

  it('should try the copy again when the connection comes back', async () => {
    host().querySelector('img')!.dispatchEvent(new Event('error'));
    await fixture.whenStable();
    online.set(false);
    await fixture.whenStable();
    expect(host().querySelector('img')).toBeNull();
    online.set(true);
    await fixture.whenStable();
    expect(host().querySelector('img')?.getAttribute('src')).toBe('/api/workshops/w-1/photos/p-1/thumb');
  });
});
