/**
 * Removes ?token=… from the address bar once the page has read it, so the link does not stay
 * in the browser history or get copied along with the address.
 */
export function forgetTokenInAddressBar(): void {
  const url = new URL(window.location.href);
  if (!url.searchParams.has('token')) return;
  url.searchParams.delete('token');
  window.history.replaceState(window.history.state, '', url.pathname + url.search + url.hash);
}
