/** A small select or input set inside a line of text or a toolbar (the editor's panels and bars). */
export const COMPACT_CONTROL_CLASS = 'rounded border border-slate-700/30 bg-white px-2 py-1 dark:border-slate-300/20 dark:bg-slate-900';
