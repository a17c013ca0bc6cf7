import { Injectable, inject } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';

/** Drawn for this app in the style of core/bench-icons.ts; registered by the photo screens, not at start-up. */
const ICONS: Record<string, string> = {
  // a camera body with its lens
  camera: '<path d="M3.5 8h3.5l1.5-2.5h7L17 8h3.5v11h-17z"/><circle cx="12" cy="13.5" r="3.5"/>',
  // a framed picture of hills under a sun
  photos:
    '<rect x="3.5" y="5" width="17" height="14" rx="1.5"/><path d="m3.5 16 5-5 4 4 3-3 5 5"/><circle cx="15.5" cy="9" r="1.3"/>',
};

@Injectable({ providedIn: 'root' })
export class PhotoIcons {
  constructor() {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    for (const [name, paths] of Object.entries(ICONS)) {
      const svg =
        '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 24 24" fill="none" stroke="currentColor" ' +
        `stroke-width="1.8" stroke-linecap="round" stroke-linejoin="round">${paths}</svg>`;
      registry.addSvgIconLiteral(name, sanitizer.bypassSecurityTrustHtml(svg));
    }
  }
}
