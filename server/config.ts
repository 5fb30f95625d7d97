import { config, type Config } from '../config/settings';

export { config, loadConfig, type Config } from '../config/settings';

export function redisUrl(): string {
  return config.REDIS_URL ?? `redis://127.0.0.1:${config.REDIS_PORT}`;
}

export function publicUrl(): string {
  return config.PUBLIC_URL ?? `http://${config.HOST === '0.0.0.0' ? '127.0.0.1' : config.HOST}:${config.PORT}`;
}

/** Settings that work but probably not as meant: printed once at start-up. */
export function startupWarnings(c: Config = config): string[] {
  const warnings: string[] = [];
  if ((c.PUBLIC_URL ?? '').startsWith('https://') && !c.TRUST_PROXY) {
    warnings.push(
      `PUBLIC_URL is ${c.PUBLIC_URL}, so session cookies are marked Secure, but TRUST_PROXY is not true: this server ` +
        'speaks plain http and browsers reaching it directly will not keep the session cookie (sign-in appears to do nothing). ' +
        'Put a TLS proxy in front and set TRUST_PROXY=true, or use an http:// PUBLIC_URL.',
    );
  }
  return warnings;
}
