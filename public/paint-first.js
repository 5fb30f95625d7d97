// A participant's page arrives drawn by the server. The app that takes it over (named in this
// script's address, ?main=main-….js) starts just after the first frame, so that frame shows the
// page at once instead of waiting for the app's code. Then every chunk the page runs
// (?code=chunk-….js,…) is linked as modulepreload, so the browser asks for all of them at once,
// and the app is imported. A tab opened in the background gets no frames: the timer starts it there.
const address = new URL(import.meta.url).searchParams;
const main = address.get('main') ?? '';
const code = (address.get('code') ?? '').split(',').filter((f) => /^chunk-[\w-]+\.js$/.test(f));
if (/^main-[\w-]+\.js$/.test(main)) {
  let started = false;
  const start = () => {
    if (started) return;
    started = true;
    for (const file of [main, ...code]) {
      const link = document.createElement('link');
      link.rel = 'modulepreload';
      link.href = file;
      document.head.append(link);
    }
    import(`./${main}`);
  };
  requestAnimationFrame(() => setTimeout(start));
  setTimeout(start, 250);
}
