/**
 * A panel schedule as CSV: export (from the device's replica, so it works offline) and import
 * (parse + preview + one batch of queued circuit mutations through the outbox).
 */
import { useMemo } from 'react';
import { Platform } from 'react-native';
import { csvFileName, planImport, parseScheduleCsv, scheduleToCsv, type ImportPlan, type CsvLookups, type ParseContext } from '@/shared/csv';
import type { CircuitCreateBody } from '@/shared/schemas';
import { useCircuitWrites } from './use-outbox';
import { useBands } from './use-records';
import { useBuilding, usePanel } from './use-register';

/** The panel, its circuits and the names the file uses for ids; null until the replica is read. */
export function useCsvContext(panelId: string) {
  const panelQuery = usePanel(panelId);
  const found = panelQuery.data;
  const building = useBuilding(found?.building.id ?? '').data;
  const bands = useBands().data;
  const ctx = useMemo((): ParseContext | null => {
    if (!found || !building) return null;
    const lookups: CsvLookups = {
      panels: building.panels.map((p) => ({ id: p.id, tag: p.tag })),
      bands: (bands ?? []).map((b) => ({ id: b.id, label: b.label })),
    };
    return { ...lookups, panel: { id: found.panel.id, system: found.panel.system, spaces: found.panel.spaces } };
  }, [found, building, bands]);
  return { query: panelQuery, found, ctx };
}

/** Save text as a file: a download on the web (native: not wired yet, see the report). */
function saveTextFile(name: string, text: string) {
  if (Platform.OS !== 'web') throw new Error('Export is available in the web app for now.');
  const blob = new Blob([`\uFEFF${text}`], { type: 'text/csv;charset=utf-8' });
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

/** "Export CSV": the schedule as `<tag>-schedule.csv`, from what is on this device. */
export function useScheduleExport(panelId: string) {
  const { found, ctx } = useCsvContext(panelId);
  return {
    ready: !!found && !!ctx,
    exportCsv() {
      if (!found || !ctx) return;
      saveTextFile(csvFileName(found.panel.tag), scheduleToCsv(found.circuits, ctx));
    },
  };
}

/** Ask the user for a .csv file (web: the browser's file picker). Null when they cancel. */
export function pickCsvFile(): Promise<{ name: string; text: string } | null> {
  if (Platform.OS !== 'web') return Promise.reject(new Error('Import is available in the web app for now.'));
  return new Promise((resolve, reject) => {
    const input = document.createElement('input');
    input.type = 'file';
    input.accept = '.csv,text/csv';
    input.style.display = 'none';
    input.addEventListener('change', () => {
      const file = input.files?.[0];
      input.remove();
      if (!file) return resolve(null);
      file.text().then((text) => resolve({ name: file.name, text }), reject);
    });
    input.addEventListener('cancel', () => {
      input.remove();
      resolve(null);
    });
    document.body.appendChild(input);
    input.click();
  });
}

/** Parse a file against the panel, plan it, and apply a clean plan as one batch of queued mutations. */
export function useScheduleImport(panelId: string) {
  const { query, found, ctx } = useCsvContext(panelId);
  const writes = useCircuitWrites(panelId);
  return {
    query,
    found,
    ready: !!ctx,
    plan(text: string, removeMissing: boolean): ImportPlan | null {
      if (!ctx || !found) return null;
      return planImport(parseScheduleCsv(text, ctx), found.circuits, removeMissing);
    },
    /** deletes first (they free positions), then patches, then new circuits */
    apply(plan: ImportPlan) {
      if (plan.blocked) throw new Error('This file still has problems: nothing was written.');
      for (const c of plan.deletes) writes.remove(c.id);
      for (const p of plan.patches) writes.save(p.circuitId, p.fields);
      for (const c of plan.creates) writes.create(c.fields as CircuitCreateBody);
    },
  };
}
