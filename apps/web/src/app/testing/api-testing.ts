/**
 * For specs only: the providers of a component that talks to the API (answered by the
 * HttpTestingController) and may link or navigate, and the check after each test.
 */
import { provideHttpClient } from '@angular/common/http';
import { type HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import {
  type EnvironmentProviders,
  type Provider,
  provideZonelessChangeDetection,
} from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

/** Zoneless change detection, an empty router, HttpClient over the testing backend; then `extra`. */
export function apiTestProviders(
  ...extra: (Provider | EnvironmentProviders)[]
): (Provider | EnvironmentProviders)[] {
  return [
    provideZonelessChangeDetection(),
    provideRouter([]),
    provideHttpClient(),
    provideHttpClientTesting(),
    ...extra,
  ];
}

/**
 * After a test: a request left open fails it; the module and the session are reset either
 * way, so the next test starts clean.
 */
export function verifyAndReset(backend: HttpTestingController): void {
  try {
    backend.verify();
  } finally {
    TestBed.resetTestingModule();
    sessionStorage.clear();
  }
}
