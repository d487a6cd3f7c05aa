import { Foundation1764633600000 } from './1764633600000-foundation';
import { ArtAndOutlines1764720000000 } from './1764720000000-art-and-outlines';
import { Library1764806400000 } from './1764806400000-library';
import { Sheets1764892800000 } from './1764892800000-sheets';
import { SheetExports1764979200000 } from './1764979200000-sheet-exports';
import { PrintShop1765152000000 } from './1765152000000-print-shop';
import { DemoMarkersAndSessions1765324800000 } from './1765324800000-demo-markers-and-sessions';
import { RateLimits1765411200000 } from './1765411200000-rate-limits';
import { ArtInSeveralCollections1765497600000 } from './1765497600000-art-in-several-collections';
import { ExportFiles1765584000000 } from './1765584000000-export-files';
import { CutBridgesAndMarks1765670400000 } from './1765670400000-cut-bridges-and-marks';
import { ExportJobs1765756800000 } from './1765756800000-export-jobs';
import { VectorArtSources1765843200000 } from './1765843200000-vector-art-sources';
import { ShopAllowances1765929600000 } from './1765929600000-shop-allowances';
import { ShopDefaults1766016000000 } from './1766016000000-shop-defaults';
import { CustomerOrders1766102400000 } from './1766102400000-customer-orders';

// Every migration, oldest first. A new one is appended here and never edited after it lands.
export const migrations = [
  Foundation1764633600000,
  ArtAndOutlines1764720000000,
  Library1764806400000,
  Sheets1764892800000,
  SheetExports1764979200000,
  PrintShop1765152000000,
  DemoMarkersAndSessions1765324800000,
  RateLimits1765411200000,
  ArtInSeveralCollections1765497600000,
  ExportFiles1765584000000,
  CutBridgesAndMarks1765670400000,
  ExportJobs1765756800000,
  VectorArtSources1765843200000,
  ShopAllowances1765929600000,
  ShopDefaults1766016000000,
  CustomerOrders1766102400000,
];
