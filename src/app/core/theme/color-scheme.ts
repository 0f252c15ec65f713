import { DOCUMENT } from '@angular/common';
import { Injectable, computed, effect, inject, signal } from '@angular/core';

/** Light or dark. */
export type SchemeName = 'light' | 'dark';

/** localStorage key for the person's explicit choice. */
export const COLOR_SCHEME_STORAGE_KEY = 'tidemark.color-scheme';

/** Root-element attribute the stylesheet reads (see `styles.scss`). */
export const COLOR_SCHEME_ATTRIBUTE = 'data-color-scheme';

/**
 * Light or dark theme. Follows the device (`prefers-color-scheme`) until the person
 * chooses with the toolbar toggle; the choice is remembered on this device.
 */
@Injectable({ providedIn: 'root' })
export class ColorScheme {
  private readonly document = inject(DOCUMENT);
  private readonly window = this.document.defaultView;
  private readonly darkQuery = this.window?.matchMedia?.('(prefers-color-scheme: dark)') ?? null;
  private readonly deviceScheme = signal<SchemeName>(this.darkQuery?.matches ? 'dark' : 'light');
  private readonly chosen = signal<SchemeName | null>(this.readChoice());

  /** The scheme in use now. */
  readonly current = computed<SchemeName>(() => this.chosen() ?? this.deviceScheme());

  /** Whether the dark scheme is in use. */
  readonly isDark = computed(() => this.current() === 'dark');

  constructor() {
    this.darkQuery?.addEventListener('change', (event) => this.deviceScheme.set(event.matches ? 'dark' : 'light'));
    // The theme's colours are `light-dark()` values: the stylesheet turns this attribute into
    // `color-scheme: light|dark`; without it, `color-scheme: light dark` lets the device decide.
    effect(() => {
      const choice = this.chosen();
      const root = this.document.documentElement;
      if (choice) {
        root.setAttribute(COLOR_SCHEME_ATTRIBUTE, choice);
      } else {
        root.removeAttribute(COLOR_SCHEME_ATTRIBUTE);
      }
    });
  }

  /** Switches to the other scheme and remembers the choice. */
  toggle(): void {
    const next: SchemeName = this.current() === 'dark' ? 'light' : 'dark';
    this.chosen.set(next);
    this.storage()?.setItem(COLOR_SCHEME_STORAGE_KEY, next);
  }

  private readChoice(): SchemeName | null {
    const stored = this.storage()?.getItem(COLOR_SCHEME_STORAGE_KEY);
    return stored === 'light' || stored === 'dark' ? stored : null;
  }

  private storage(): Storage | null {
    // Storage access throws in some privacy modes; the theme then simply isn't remembered.
    try {
      return this.window?.localStorage ?? null;
    } catch {
      return null;
    }
  }
}
