/** Shown by the top-level error boundary when the app itself fails to render. */
export function AppCrashed() {
  return (
    <div role="alert" className="grid min-h-screen place-items-center px-6">
      <div className="max-w-md text-center">
        <p className="font-mono text-xs tracking-widest text-amber-700 uppercase dark:text-amber-400">Parley</p>
        <h1 className="mt-2 text-xl font-semibold">Parley stopped unexpectedly</h1>
        <p className="mt-2 text-sm text-slate-600 dark:text-slate-400">Your saved work on the server is safe. Reload the page to continue.</p>
        <button type="button" onClick={() => window.location.reload()} className="mt-6 h-9 rounded-md bg-amber-500 px-4 text-sm font-medium text-slate-950 hover:bg-amber-400">
          Reload
        </button>
      </div>
    </div>
  );
}
