/**
 * What a screen may ask of one building on the device: its row and lookups by id. Screens get a
 * view from the hooks, never the replica's copy, so the copy's storage shape (maps by id, record
 * lists, cursors) can change without touching a component.
 */
import { recordsOf, type BuildingCopy } from '@/lib/replica';
import type { Deficiency, Inspection } from '@/shared/records';
import type { Building, Circuit, Panel } from '@/shared/schemas';

export interface BuildingView {
  readonly building: Building;
  panel(id: string): Panel | undefined;
  /** every panel, by tag (numbers in tags compare as numbers) */
  panels(): Panel[];
  circuit(id: string): Circuit | undefined;
  /** the panel's circuits by position */
  circuitsOf(panelId: string): Circuit[];
  inspection(id: string): Inspection | undefined;
  deficiency(id: string): Deficiency | undefined;
}

// one view per copy: copies are replaced, never edited, so a view stays true for its copy's life
const views = new WeakMap<BuildingCopy, BuildingView>();

export function viewOf(copy: BuildingCopy): BuildingView {
  const known = views.get(copy);
  if (known) return known;
  const view: BuildingView = {
    building: copy.building,
    panel: (id) => copy.panels[id],
    panels: () => Object.values(copy.panels).sort((a, b) => a.tag.localeCompare(b.tag, undefined, { numeric: true })),
    circuit: (id) => copy.circuits[id],
    circuitsOf: (panelId) =>
      Object.values(copy.circuits)
        .filter((c) => c.panelId === panelId)
        .sort((a, b) => a.position - b.position),
    inspection: (id) => recordsOf(copy, 'inspections')[id],
    deficiency: (id) => recordsOf(copy, 'deficiencies')[id],
  };
  views.set(copy, view);
  return view;
}
