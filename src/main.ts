import { bootstrapApplication } from '@angular/platform-browser';
import { appConfig } from './app/app.config';
import { App } from './app/app';
import { startEarlyRequest } from './app/core/early-request';

// Before the app boots: the page's own data travels while Angular starts and routes.
startEarlyRequest(location.pathname);
bootstrapApplication(App, appConfig).catch((err) => console.error(err));
