import { Migration20261204170000PostgresInitial } from './Migration20261204170000PostgresInitial.ts';
import { Migration20261204181500ReportLinksAndImportMappings } from './Migration20261204181500ReportLinksAndImportMappings.ts';
import { Migration20261204190000TraceViews } from './Migration20261204190000TraceViews.ts';
import { Migration20261204190100TeamVectorSearch } from './Migration20261204190100TeamVectorSearch.ts';
import { Migration20261204193000RateLimitCounters } from './Migration20261204193000RateLimitCounters.ts';
import { Migration20261204194500SweepRuns } from './Migration20261204194500SweepRuns.ts';
import { Migration20261204223000LibraryVersion } from './Migration20261204223000LibraryVersion.ts';
import { Migration20261205013000MessageChunks } from './Migration20261205013000MessageChunks.ts';
import { Migration20261205020000AnswerVersion } from './Migration20261205020000AnswerVersion.ts';

/** Every PostgreSQL migration in order (the same schema as ../migrations, in PostgreSQL's dialect). Append new ones. */
export const postgresMigrationsList = [
  { name: 'Migration20261204170000PostgresInitial', class: Migration20261204170000PostgresInitial },
  { name: 'Migration20261204181500ReportLinksAndImportMappings', class: Migration20261204181500ReportLinksAndImportMappings },
  { name: 'Migration20261204190000TraceViews', class: Migration20261204190000TraceViews },
  { name: 'Migration20261204190100TeamVectorSearch', class: Migration20261204190100TeamVectorSearch },
  { name: 'Migration20261204193000RateLimitCounters', class: Migration20261204193000RateLimitCounters },
  { name: 'Migration20261204194500SweepRuns', class: Migration20261204194500SweepRuns },
  { name: 'Migration20261204223000LibraryVersion', class: Migration20261204223000LibraryVersion },
  { name: 'Migration20261205013000MessageChunks', class: Migration20261205013000MessageChunks },
  { name: 'Migration20261205020000AnswerVersion', class: Migration20261205020000AnswerVersion },
];
