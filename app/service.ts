/**
 * The one table of operations the screen may ask for. Electron IPC (main/ipc.ts) and the
 * browser-mode HTTP server (main/http.ts) both serve exactly this table.
 * Each concept contributes its entries from app/services/<concept>.ts.
 */
import type { ServiceEntry } from './services/types.js';
import { filesServices } from './services/files.js';
import { mapPanelsServices } from './services/map-panels.js';
import { viewExportServices } from './services/view-export.js';
import { viewDataServices } from './services/view-data.js';
import { viewsServices } from './services/views.js';
import { linesServices } from './services/lines.js';
import { spinupServices } from './services/spinup.js';
import { cfServices } from './services/cf.js';
import { reportServices } from './services/report.js';

export const serviceTable: ServiceEntry[] = [...filesServices, ...viewsServices, ...viewExportServices, ...viewDataServices, ...mapPanelsServices, ...linesServices, ...cfServices, ...spinupServices, ...reportServices];

export function findService(name: string): ServiceEntry | undefined {
  return serviceTable.find((e) => e.name === name);
}
