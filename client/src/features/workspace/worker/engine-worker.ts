/** The Web Worker the workspace computes a big survey's loads in (`use-survey-summary.ts` starts it). */
import { expose } from 'comlink';
import { engineApi } from './engine-api';

expose(engineApi);
