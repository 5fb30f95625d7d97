import { bootstrapApplication } from '@angular/platform-browser';
import { appConfig } from './app/app.config';
import { App } from './app/app';
import { startEarlyRequest } from './app/core/early-request';

// Before the app boots: the page's own data travels while Angular starts and routes.
startEarlyRequest(location.pathname);
const boot = () => void bootstrapApplication(App, appConfig).catch((err) => console.error(err));

// A page drawn on the server (a participant's own page) is shown first and taken over just after:
// starting the app at once would hold that first paint back until the app had run. The timer
// covers a tab opened in the background, which gets no animation frames.
if (document.querySelector('app-root[ng-server-context]')) {
  let started = false;
  const once = () => {
    if (started) return;
    started = true;
    boot();
  };
  requestAnimationFrame(() => setTimeout(once));
  setTimeout(once, 250);
} else {
  boot();
}
