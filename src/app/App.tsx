/** Placeholder home until the studio app lands: says what Tautline is and that the server is up. */
export function App() {
  return (
    <main className="min-h-screen bg-slate-100 font-sans text-slate-900 dark:bg-slate-950 dark:text-slate-100">
      <div className="mx-auto max-w-2xl px-gutter py-16">
        <p className="text-sm font-semibold uppercase tracking-widest text-brass-600 dark:text-brass-400">Tautline</p>
        <h1 className="mt-2 text-4xl font-semibold">String tones shaped by physics</h1>
        <p className="mt-4 text-lg text-slate-700 dark:text-slate-300">
          The studio workbench is being built. The string engine and its command line are ready: see the README for
          <code className="mx-1 rounded bg-slate-300/40 px-1">npm run cli</code>.
        </p>
      </div>
    </main>
  );
}
