import { bootstrapApplication } from '@angular/platform-browser';

import { App } from './app/app';
import { appConfig } from './app/app.config';
import { applySavedChoice } from './app/core/theme-preference';

// Before Angular renders anything, so a saved dark scheme never flashes light.
applySavedChoice(document);

bootstrapApplication(App, appConfig).catch((error: unknown) => console.error(error));
