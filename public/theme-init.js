// Runs before the first paint so a dark system does not flash a light page.
// Keep in step with src/lib/theme.ts (same storage key and class names).
(() => {
  var choice = 'system';
  try {
    choice = localStorage.getItem('parley.theme') || 'system';
  } catch {
    // Storage can be blocked; follow the system then.
  }
  var dark = choice === 'dark' || (choice !== 'light' && window.matchMedia('(prefers-color-scheme: dark)').matches);
  document.documentElement.classList.toggle('dark', dark);
})();
