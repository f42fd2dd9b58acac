import { z } from 'zod';
import { SurveySchema } from './survey';

/** The published JSON Schema of the survey file (input form: optional fields may be omitted). */
export function surveyJsonSchema(): Record<string, unknown> {
  const schema = z.toJSONSchema(SurveySchema, { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>;
  return {
    $schema: schema.$schema,
    $id: 'https://brineline.invalid/schemas/survey.schema.json',
    title: 'Brineline survey',
    description: 'A casualty survey: vessel, conditions, compartments and boundaries. SI units, ship axes (x forward from the aft perpendicular, y to port, z up from the baseline).',
    ...schema,
  };
}

/** File text for shared/schemas/survey.schema.json. */
export function surveyJsonSchemaText(): string {
  return `${JSON.stringify(surveyJsonSchema(), null, 2)}\n`;
}
