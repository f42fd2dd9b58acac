/**
 * Writes the generated files that are committed: shared/schemas/survey.schema.json (from the zod
 * schema) and seeds/demo-survey.json (from demoSurvey()). Run: npx tsx scripts/gen-schema.ts
 */
import { writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { surveyJsonSchemaText } from '@shared/schemas/json-schema';
import { SurveySchema } from '@shared/schemas/survey';
import { demoSurvey } from '../seeds/demo-survey';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '..');

export function demoSurveyText(): string {
  return `${JSON.stringify(SurveySchema.parse(demoSurvey()), null, 2)}\n`;
}

export function main(): void {
  writeFileSync(resolve(root, 'shared/schemas/survey.schema.json'), surveyJsonSchemaText());
  writeFileSync(resolve(root, 'seeds/demo-survey.json'), demoSurveyText());
  console.log('wrote shared/schemas/survey.schema.json and seeds/demo-survey.json');
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
