// Applies the saved light/dark choice before React starts, so the page never flashes the wrong
// scheme. An external file rather than an inline script so a strict Content-Security-Policy holds.
(function () {
  var scheme = 'auto';
  try {
    scheme = window.localStorage.getItem('driftgrid.color-scheme') || 'auto';
  } catch (e) {
    /* storage blocked: follow the system */
  }
  if (scheme !== 'light' && scheme !== 'dark') {
    scheme = window.matchMedia && window.matchMedia('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
  }
  document.documentElement.setAttribute('data-mantine-color-scheme', scheme);
})();
