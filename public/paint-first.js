// A participant's page arrives drawn by the server. The app that takes it over (named in this
// script's address, ?main=main-….js) starts just after the first frame, so that frame shows the
// page at once instead of waiting for the app to run. Its code is already fetched meanwhile
// (modulepreload). A tab opened in the background gets no frames: the timer starts it there.
const main = new URL(import.meta.url).searchParams.get('main') ?? '';
if (/^main-[\w-]+\.js$/.test(main)) {
  let started = false;
  const start = () => {
    if (started) return;
    started = true;
    import(`./${main}`);
  };
  requestAnimationFrame(() => setTimeout(start));
  setTimeout(start, 250);
}
