/** Export a survey as one JSON file (the published survey format) and import one, with readable errors. */
import { useRef } from 'react';
import { useNavigate } from 'react-router';
import type { Survey } from '@shared/schemas/survey';
import { paths } from '@client/config/paths';
import { secondaryBtn } from '@client/components/ui/fields';

export function ExportButton({ survey }: { survey: Survey }) {
  const exportFile = () => {
    const blob = new Blob([JSON.stringify(survey, null, 2)], { type: 'application/json' });
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = `${survey.vessel.name.replace(/[^\w-]+/g, '-')}-${survey.id.slice(0, 8)}.brineline.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };
  return (
    <button type="button" className={secondaryBtn} onClick={exportFile}>
      Export file
    </button>
  );
}

export function ImportButton({ onError }: { onError: (message: string | null) => void }) {
  const input = useRef<HTMLInputElement>(null);
  const navigate = useNavigate();
  const onFile = async (file: File) => {
    onError(null);
    // Loaded when a file is chosen: reading and storing one needs the survey schema (zod), which the
    // survey list does not otherwise load.
    const [{ parseSurveyFile, withFreshIds }, { createLocalSurvey, getLocalSurvey }] = await Promise.all([
      import('../utils/survey-file'),
      import('@client/offline/survey-store'),
    ]);
    const parsed = parseSurveyFile(await file.text());
    if (!parsed.ok) {
      onError(`${file.name} is not a survey file Brineline can read:\n${parsed.errors.slice(0, 12).join('\n')}`);
      return;
    }
    let survey = parsed.survey;
    if (await getLocalSurvey(survey.id)) survey = withFreshIds(survey);
    try {
      await createLocalSurvey(survey);
      navigate(paths.survey(survey.id));
    } catch (err) {
      onError(err instanceof Error ? err.message : 'The survey could not be stored on this device.');
    }
  };
  return (
    <>
      <button type="button" className={secondaryBtn} onClick={() => input.current?.click()}>
        Import file
      </button>
      <input
        ref={input}
        type="file"
        accept="application/json,.json"
        className="sr-only"
        aria-label="Survey file to import"
        data-testid="import-input"
        onChange={(e) => {
          const f = e.target.files?.[0];
          e.target.value = '';
          if (f) void onFile(f);
        }}
      />
    </>
  );
}
