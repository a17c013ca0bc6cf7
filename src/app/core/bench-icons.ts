import { Injectable, inject } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';

/**
 * Benchtide's own line icons (24 x 24, drawn for this app, stroked in currentColor).
 * Shipped in the bundle so they show offline and nothing is fetched from elsewhere.
 */
const ICONS: Record<string, string> = {
  // a workbench with a cup on it
  bench: '<path d="M3 11h18M5 11v9M19 11v9M8 11V7h4v4"/><path d="M14 11V8.5a2 2 0 0 1 4 0V11"/>',
  // a mixing cup tipping a stream into a base
  pour: '<path d="M5 4h8l-1.5 7h-5z"/><path d="M11 11c2 1 3 3 3 5"/><path d="M4 19c2-1.5 4-1.5 6 0s4 1.5 6 0 4-1.5 4-1.5"/>',
  // a ruler with scale ticks
  scale: '<rect x="2.5" y="8" width="19" height="8" rx="1.5"/><path d="M6 8v3M9.5 8v4.5M13 8v3M16.5 8v4.5M20 8v3"/>',
  // a stopwatch
  timer: '<circle cx="12" cy="13.5" r="7"/><path d="M12 13.5V10M10 3h4M12 3v3.5M18 7l1.5-1.5"/>',
  // a triangle with an exclamation mark
  caution: '<path d="M12 3.5 2.5 20h19z"/><path d="M12 10v4.5M12 17.2v.3"/>',
  // an i in a circle
  info: '<circle cx="12" cy="12" r="9"/><path d="M12 11v6M12 7.5v.3"/>',
  // a tick
  done: '<path d="m5 12.5 4.5 4.5L19 7.5"/>',
  // three stacked wave lines: layers
  layers: '<path d="M4 8c2.7-2 5.3-2 8 0s5.3 2 8 0M4 13c2.7-2 5.3-2 8 0s5.3 2 8 0M4 18c2.7-2 5.3-2 8 0s5.3 2 8 0"/>',
  // a cloud with a slash: no connection
  offline: '<path d="M7 18h10a4 4 0 0 0 .6-7.95A6 6 0 0 0 6.3 9.6 4.2 4.2 0 0 0 7 18z"/><path d="m4 4 16 16"/>',
  // an arrow to the right
  forward: '<path d="M5 12h14M13 6l6 6-6 6"/>',
  // three people seated at one table
  workshop:
    '<circle cx="12" cy="6.5" r="2.5"/><circle cx="5" cy="9" r="2"/><circle cx="19" cy="9" r="2"/>' +
    '<path d="M8 16.5v-1.5a4 4 0 0 1 8 0v1.5M2.5 16.5v-1a3 3 0 0 1 4.3-2.7M21.5 16.5v-1a3 3 0 0 0-4.3-2.7"/>' +
    '<path d="M2 16.5h20M5 16.5v4M19 16.5v4"/>',
  // an open eye: show what is typed
  eye: '<path d="M2.5 12s3.5-6.5 9.5-6.5 9.5 6.5 9.5 6.5-3.5 6.5-9.5 6.5S2.5 12 2.5 12z"/><circle cx="12" cy="12" r="3"/>',
  // the eye struck through: hide it again
  'eye-off':
    '<path d="M2.5 12s3.5-6.5 9.5-6.5 9.5 6.5 9.5 6.5-3.5 6.5-9.5 6.5S2.5 12 2.5 12z"/><circle cx="12" cy="12" r="3"/>' +
    '<path d="m4 4 16 16"/>',
  // an envelope
  mail: '<rect x="3" y="5.5" width="18" height="13" rx="1.5"/><path d="m3.5 6.5 8.5 6.5 8.5-6.5"/>',
};

@Injectable({ providedIn: 'root' })
export class BenchIcons {
  private readonly registry = inject(MatIconRegistry);
  private readonly sanitizer = inject(DomSanitizer);

  register(): void {
    for (const [name, paths] of Object.entries(ICONS)) {
      const svg =
        '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 24 24" fill="none" stroke="currentColor" ' +
        `stroke-width="1.8" stroke-linecap="round" stroke-linejoin="round">${paths}</svg>`;
      this.registry.addSvgIconLiteral(name, this.sanitizer.bypassSecurityTrustHtml(svg));
    }
  }
}
