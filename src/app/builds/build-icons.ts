import { Injectable, inject } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';

/**
 * The line icons only the Builds screens use, drawn for Benchtide in the same 24 x 24 stroke style as the
 * app's own set. Kept in the `builds` namespace (`svgIcon="builds:edit"`) and in this lazy chunk, so they
 * cost the first download nothing.
 */
const ICONS: Record<string, string> = {
  // a clipboard with lines: still on paper
  planning: '<rect x="5" y="4" width="14" height="17" rx="1.5"/><path d="M9 4V2.8h6V4M8.5 10h7M8.5 14h7M8.5 18h4"/>',
  // a brush at work
  building:
    '<path d="M12.5 11.5 20 4"/><path d="M12.5 11.5a3 3 0 0 0-4.2 0c-1.6 1.6-1 3.6-3.3 5.7 3 1.2 6.2.6 7.8-1a3 3 0 0 0-.3-4.7z"/>',
  // a plus
  add: '<path d="M12 5v14M5 12h14"/>',
  // a pencil
  edit: '<path d="M4 20h4L19 9l-4-4L4 16z"/><path d="m13.5 6.5 4 4"/>',
  // a bin
  delete: '<path d="M4 7h16M9 7V4h6v3M6 7l1 13h10l1-13M10 11v6M14 11v6"/>',
  // a printer with a sheet in it
  print: '<path d="M7 9V3h10v6"/><rect x="3" y="9" width="18" height="8" rx="1.5"/><path d="M7 14h10v7H7z"/>',
  // an arrow to the left
  back: '<path d="M19 12H5M11 6l-6 6 6 6"/>',
  // a notebook: one entry in the log
  step: '<path d="M6 3h11a1 1 0 0 1 1 1v16a1 1 0 0 1-1 1H6z"/><path d="M9 3v18M12 8h3M12 12h3"/>',
};

@Injectable({ providedIn: 'root' })
export class BuildIcons {
  private readonly registry = inject(MatIconRegistry);
  private readonly sanitizer = inject(DomSanitizer);
  private registered = false;

  register(): void {
    if (this.registered) return;
    this.registered = true;
    for (const [name, paths] of Object.entries(ICONS)) {
      const svg =
        '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 24 24" fill="none" stroke="currentColor" ' +
        `stroke-width="1.8" stroke-linecap="round" stroke-linejoin="round">${paths}</svg>`;
      this.registry.addSvgIconLiteralInNamespace('builds', name, this.sanitizer.bypassSecurityTrustHtml(svg));
    }
  }
}
