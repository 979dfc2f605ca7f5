import { Directive, ElementRef, effect, inject, input } from '@angular/core';
import type { UrlTable } from './url-table-state';

/**
 * Connects a search box to a URL-backed table: typing feeds the debounced search, and a URL
 * change made elsewhere (back, forward, "Clear filters", a link) shows its text in the box. The
 * box is never rewritten while it has focus, so a late answer cannot eat what is being typed.
 */
@Directive({
  selector: 'input[klTableSearch]',
  host: { '(input)': 'onInput()' },
})
export class TableSearch {
  /** The table whose `q` filter this box edits. */
  readonly table = input.required<UrlTable<'q'>>({ alias: 'klTableSearch' });
  private readonly element: HTMLInputElement = inject(ElementRef).nativeElement;

  constructor() {
    effect(() => {
      const q = this.table().state().filters.q ?? '';
      const isTyping = this.element.ownerDocument.activeElement === this.element;
      if (!isTyping && this.element.value.trim() !== q) {
        this.element.value = q;
      }
    });
  }

  protected onInput(): void {
    this.table().search(this.element.value);
  }
}
