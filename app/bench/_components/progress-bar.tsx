/** Progress across the whole job, in words and as a bar. */
export function ProgressBar({ done, total }: { done: number; total: number }) {
  const pct = total ? Math.round((done / total) * 100) : 0;
  return (
    <div className="flex items-center gap-3" data-testid="job-progress">
      <div
        className="h-5 flex-1 overflow-hidden rounded-full border-2 border-steel-900 bg-white"
        role="progressbar"
        aria-valuemin={0}
        aria-valuemax={total}
        aria-valuenow={done}
        aria-label="Steps done"
      >
        <div className="h-full bg-pass" style={{ width: `${pct}%` }} />
      </div>
      <span className="whitespace-nowrap text-lg font-bold">
        {done} of {total} steps done
      </span>
    </div>
  );
}
