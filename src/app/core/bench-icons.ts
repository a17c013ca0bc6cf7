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
  // a diorama base seen at an angle, a tree on it
  builds:
    '<path d="M3 15.5 12 19l9-3.5-9-3.5z"/><path d="M3 15.5V17l9 3.5 9-3.5v-1.5"/><path d="M12 15.5V9"/><path d="M9.5 11 12 5l2.5 6z"/>',
  // a shelf with a tall and a short bottle
  shelf:
    '<path d="M3 20h18M4 20v-1M20 20v-1"/><rect x="6" y="9" width="4" height="11" rx="1"/><path d="M7 9V6.5h2V9"/><rect x="13" y="13" width="5" height="7" rx="1"/>',
  // a stack of coins
  costs:
    '<ellipse cx="12" cy="6.5" rx="7" ry="2.5"/><path d="M5 6.5v4c0 1.4 3.1 2.5 7 2.5s7-1.1 7-2.5v-4M5 10.5v4c0 1.4 3.1 2.5 7 2.5s7-1.1 7-2.5v-4M5 14.5v3c0 1.4 3.1 2.5 7 2.5s7-1.1 7-2.5v-3"/>',
  // a plus
  add: '<path d="M12 5v14M5 12h14"/>',
  // a pencil
  edit: '<path d="M4 20h4L19 9l-4-4L4 16z"/><path d="m13.5 6.5 4 4"/>',
  // a bin
  delete: '<path d="M4 7h16M9 7V4.5h6V7M6.5 7l1 13h9l1-13"/><path d="M10 11v5M14 11v5"/>',
  // a printer
  print: '<path d="M7 9V3.5h10V9"/><rect x="3.5" y="9" width="17" height="7.5" rx="1.5"/><path d="M7 14h10v6.5H7z"/>',
  // two arrows chasing round: sync
  sync: '<path d="M19.5 9A8 8 0 0 0 5.2 7.5M4.5 15a8 8 0 0 0 14.3 1.5"/><path d="M5 3.5v4h4M19 20.5v-4h-4"/>',
  // an arrow down into a phone: install
  install: '<rect x="6.5" y="2.5" width="11" height="19" rx="2"/><path d="M12 7v7M9 11l3 3 3-3M10.5 18.5h3"/>',
  // a notebook page with lines: a build step
  step: '<rect x="5" y="3" width="14" height="18" rx="1.5"/><path d="M8.5 8h7M8.5 12h7M8.5 16h4"/>',
  // three dots: more
  more: '<circle cx="5.5" cy="12" r="1"/><circle cx="12" cy="12" r="1"/><circle cx="18.5" cy="12" r="1"/>',
  // a chevron back
  back: '<path d="M15 5l-7 7 7 7"/>',
  // a clipboard with lines: a build still on paper
  planning: '<rect x="5" y="4" width="14" height="17" rx="1.5"/><path d="M9 4V2.8h6V4M8.5 10h7M8.5 14h7M8.5 18h4"/>',
  // a brush at work: a build under way
  building:
    '<path d="M12.5 11.5 20 4"/><path d="M12.5 11.5a3 3 0 0 0-4.2 0c-1.6 1.6-1 3.6-3.3 5.7 3 1.2 6.2.6 7.8-1a3 3 0 0 0-.3-4.7z"/>',
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
