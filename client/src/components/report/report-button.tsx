/**
 * "Calculation report": fetches the server-rendered report with the signed-in token and opens it in
 * a new tab, ready to print. The report is the server's copy, so a survey must have synced first.
 */
import { useState } from 'react';
import { apiFetch } from '@client/lib/api-client';
import { useUnitSystem } from '@client/lib/unit-system';
import { buttonClass } from '@client/components/ui/button';

export function ReportButton({ surveyId, className = '' }: { surveyId: string; className?: string }) {
  const system = useUnitSystem();
  const [error, setError] = useState<string | null>(null);
  const open = async () => {
    setError(null);
    // open the tab at once (a pop-up blocker allows it only inside the click), fill it when the page arrives
    const tab = window.open('', '_blank');
    try {
      const res = await apiFetch(`/api/surveys/${encodeURIComponent(surveyId)}/report?units=${system}`);
      const url = URL.createObjectURL(new Blob([await res.text()], { type: 'text/html' }));
      if (tab) tab.location.href = url;
      else window.location.assign(url);
    } catch (e) {
      tab?.close();
      const status = (e as { status?: number }).status;
      setError(status === 404 ? 'The report is made from the survey on the server: sync it first.' : e instanceof Error ? e.message : 'The report could not be made.');
    }
  };
  return (
    <span className={className}>
      <button type="button" className={buttonClass('secondary')} onClick={() => void open()} data-testid="report-button">
        Calculation report
      </button>
      {error && (
        <span role="alert" className="ml-2 text-sm font-bold text-danger">
          {error}
        </span>
      )}
    </span>
  );
}
