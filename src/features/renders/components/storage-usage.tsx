import type { RenderStorage } from '../api/get-renders';
import { storageSummary } from '../render-summary';

/** Share of the quota above which the bar turns to a warning colour. */
const NEARLY_FULL = 0.9;

/** How much of the studio's render storage is used: "1.2 GB of 2 GB used", with a bar. */
export function StorageUsage({ storage }: { storage: RenderStorage }) {
  const share = storage.quotaBytes > 0 ? Math.min(1, storage.usedBytes / storage.quotaBytes) : 1;
  return (
    <div className="flex min-w-56 flex-col gap-1 text-sm">
      <p>
        <span className="font-semibold">Storage:</span> {storageSummary(storage)}
        {share >= NEARLY_FULL && <span className="text-ember-600 dark:text-ember-400"> · nearly full, delete old renders to make room</span>}
      </p>
      <div aria-hidden="true" className="h-1.5 w-full overflow-hidden rounded-full bg-slate-300 dark:bg-slate-700">
        <div className={`h-full rounded-full ${share >= NEARLY_FULL ? 'bg-ember-500' : 'bg-brass-500'}`} style={{ width: `${share * 100}%` }} />
      </div>
    </div>
  );
}
