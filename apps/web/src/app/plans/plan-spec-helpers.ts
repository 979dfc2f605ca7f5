import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { provideHttpClientTesting } from '@angular/common/http/testing';
import { Component, type EnvironmentProviders, type Provider,
  provideZonelessChangeDetection } from '@angular/core';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { type Routes, provideRouter, withComponentInputBinding } from '@angular/router';
import { apiInterceptor } from '../auth/api-interceptor';

/** A page's text with white space collapsed, for the specs of the plans screens. */
export function words(node: Element | null | undefined): string {
  return (node?.textContent ?? '').replace(/\s+/g, ' ').trim();
}

/** The first button or link in `root` whose text contains `label`. */
export function button(root: ParentNode, label: string): HTMLElement | undefined {
  return [...root.querySelectorAll<HTMLElement>('button, a')].find((candidate) =>
    words(candidate).includes(label));
}

/** Types `value` into an input or textarea the way a person does (an input event). */
export function type(field: HTMLInputElement | HTMLTextAreaElement, value: string): void {
  field.value = value;
  field.dispatchEvent(new Event('input'));
  field.dispatchEvent(new Event('blur'));
}

/** A stand-in page for routes a spec navigates to but does not test. */
@Component({ selector: 'kl-spec-stub', template: 'elsewhere' })
export class StubPage {}

/** The providers every plans spec needs: zoneless, routes, HTTP through the interceptor. */
export function plansTestProviders(routes: Routes): (Provider | EnvironmentProviders)[] {
  return [
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    provideHttpClient(withInterceptors([apiInterceptor])),
    provideHttpClientTesting(),
    { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
  ];
}

/** Removes what dialogs, menus and snack bars left in the document. */
export function clearOverlays(): void {
  document.querySelectorAll('.cdk-overlay-container').forEach((node) => node.remove());
}
