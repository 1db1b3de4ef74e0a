import { provideHttpClient, withInterceptors } from '@angular/common/http';
import {
  ApplicationConfig,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import {
  TitleStrategy,
  provideRouter,
  withComponentInputBinding,
  withInMemoryScrolling,
} from '@angular/router';

import { routes } from './app.routes';
import { apiErrorInterceptor } from './core/api-error-interceptor';
import { TensileTitleStrategy } from './core/title-strategy';

/** Application-wide providers. */
export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    // Zoneless: all state lives in signals and every component is OnPush, so change detection is
    // driven by signal writes and template events; zone.js (and its ~35 kB of patching) is not loaded.
    provideZonelessChangeDetection(),
    provideHttpClient(withInterceptors([apiErrorInterceptor])),
    provideRouter(
      routes,
      withComponentInputBinding(),
      withInMemoryScrolling({ scrollPositionRestoration: 'enabled', anchorScrolling: 'enabled' }),
    ),
    { provide: TitleStrategy, useClass: TensileTitleStrategy },
  ],
};
