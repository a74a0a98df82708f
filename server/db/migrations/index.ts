import { Migration20250601000000Initial } from './Migration20250601000000Initial.ts';
import { Migration20261201183000Traces } from './Migration20261201183000Traces.ts';
import { Migration20261201200000Library } from './Migration20261201200000Library.ts';
import { Migration20261204170000ReportShareLinks } from './Migration20261204170000ReportShareLinks.ts';
import { Migration20261204173000ImportMappings } from './Migration20261204173000ImportMappings.ts';
import { Migration20261204190000TraceViews } from './Migration20261204190000TraceViews.ts';
import { Migration20261204190100TeamVectorSearch } from './Migration20261204190100TeamVectorSearch.ts';
import { Migration20261204193000RateLimitCounters } from './Migration20261204193000RateLimitCounters.ts';
import { Migration20261204194500SweepRuns } from './Migration20261204194500SweepRuns.ts';
import { Migration20261204223000LibraryVersion } from './Migration20261204223000LibraryVersion.ts';
import { Migration20261205013000MessageChunks } from './Migration20261205013000MessageChunks.ts';
import { Migration20261205020000AnswerVersion } from './Migration20261205020000AnswerVersion.ts';

/** Every migration in order; the migrator runs the ones a database has not seen. Append new ones. */
export const migrationsList = [
  { name: 'Migration20250601000000Initial', class: Migration20250601000000Initial },
  { name: 'Migration20261201183000Traces', class: Migration20261201183000Traces },
  { name: 'Migration20261201200000Library', class: Migration20261201200000Library },
  { name: 'Migration20261204170000ReportShareLinks', class: Migration20261204170000ReportShareLinks },
  { name: 'Migration20261204173000ImportMappings', class: Migration20261204173000ImportMappings },
  { name: 'Migration20261204190000TraceViews', class: Migration20261204190000TraceViews },
  { name: 'Migration20261204190100TeamVectorSearch', class: Migration20261204190100TeamVectorSearch },
  { name: 'Migration20261204193000RateLimitCounters', class: Migration20261204193000RateLimitCounters },
  { name: 'Migration20261204194500SweepRuns', class: Migration20261204194500SweepRuns },
  { name: 'Migration20261204223000LibraryVersion', class: Migration20261204223000LibraryVersion },
  { name: 'Migration20261205013000MessageChunks', class: Migration20261205013000MessageChunks },
  { name: 'Migration20261205020000AnswerVersion', class: Migration20261205020000AnswerVersion },
];
