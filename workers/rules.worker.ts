/**
 * The rules engine in a Web Worker (comlink): the Offers page's checks and sink choices.
 * Every function returns a Result value rather than throwing (see ./expose.ts).
 */
import { analyseOffers, readOffers } from '../shared/rules/analyse-offers.ts';
import { exposeEngine } from './expose.ts';

const api = { analyseOffers, readOffers };
exposeEngine(api);
export type RulesApi = typeof api;
