import { Button } from '../../../components/ui/button.tsx';
import { useAddFromAdvice } from '../api/save-sample.ts';

/** One click: the forecast's advice for the given days becomes planned samples. */
export function AddFromAdviceButton({ orgId, siteId, forecastId, dates, label = 'Add advice to the plan' }: { orgId: string; siteId: string; forecastId: string; dates?: string[]; label?: string }) {
  const add = useAddFromAdvice(orgId, siteId);
  return (
    <div className="flex flex-wrap items-center gap-2">
      <Button onClick={() => add.mutate({ forecastId, dates })} disabled={add.isPending}>
        {add.isPending ? 'Adding…' : label}
      </Button>
      {add.data && (
        <span role="status" className="text-sm">
          {add.data.samples.length} sample(s) added to the plan{add.data.skipped ? `, ${add.data.skipped} already planned` : ''}.
        </span>
      )}
      {add.error && <span role="alert" className="text-sm text-alarm-600">{add.error.message}</span>}
    </div>
  );
}
