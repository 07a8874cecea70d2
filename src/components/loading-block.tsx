/** A placeholder of fixed height while data loads, so the page does not shift when it arrives. */
export function LoadingBlock({ label = 'Loading…', rows = 4 }: { label?: string; rows?: number }) {
  return (
    <div role="status" aria-live="polite" className="flex flex-col gap-2">
      <span className="sr-only">{label}</span>
      {Array.from({ length: rows }, (_, index) => (
        <div key={index} className="h-10 animate-pulse rounded-md bg-slate-700/10 dark:bg-slate-100/10" aria-hidden="true" />
      ))}
    </div>
  );
}
