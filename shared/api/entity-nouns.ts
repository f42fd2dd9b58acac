/**
 * The one table of nouns for the survey's collections, in the singular a sentence needs ("Save boundary
 * “Aft bulkhead”", "Delete a photo"). The device's outbox and conflict lists and the server's revision
 * history say the same word for the same thing.
 */
import type { SurveyCollection } from '../schemas/sync';

export const ENTITY_NOUNS: Readonly<Record<SurveyCollection, string>> = {
  conditions: 'condition',
  compartments: 'compartment',
  boundaries: 'boundary',
  fluids: 'fluid',
  photos: 'photo',
};

/** The singular noun of a collection name; an unknown name (a newer server's) is returned as it is. */
export function entityNoun(collection: string): string {
  return Object.hasOwn(ENTITY_NOUNS, collection) ? ENTITY_NOUNS[collection as SurveyCollection] : collection;
}
