import { type BootstrapContext, bootstrapApplication } from '@angular/platform-browser';
import { App } from './app/app';
import { serverConfig } from './app/app.config.server';

/** The app as the server renders it (participant pages only, see app.routes.server.ts). */
const bootstrap = (context: BootstrapContext) => bootstrapApplication(App, serverConfig, context);
export default bootstrap;
