import { bootstrapApplication } from '@angular/platform-browser';

import { App } from './app/app';
import { appConfig } from './app/app.config';
import { applySavedChoice } from './app/core/theme-preference';
import { prefetchDrillPage } from './app/drills/drill-prefetch';

// Before Angular renders anything, so a saved dark scheme never flashes light.
applySavedChoice(document);
// A drill page opened cold: its code and its preset load while Angular boots.
prefetchDrillPage(location.pathname, location.search);

bootstrapApplication(App, appConfig).catch((error: unknown) => console.error(error));
