/**
 * The panel's controls, web components from @vscode-elements/elements
 * (only the ones used are imported, so only they are bundled): the energy
 * unit switch, the pin button and the export buttons. Listeners are attached
 * here; the page has no inline handlers.
 */
import '@vscode-elements/elements/dist/vscode-button/index.js';
import '@vscode-elements/elements/dist/vscode-option/index.js';
import '@vscode-elements/elements/dist/vscode-single-select/index.js';
import { ENERGY_AXIS_UNITS, type EnergyAxisUnit } from '../../src/core/packageFree';

/** What the controls ask for. */
export interface ControlActions {
  unit(unit: EnergyAxisUnit): void;
  pin(): void;
  exportPng(): void;
  exportCsv(): void;
  copyImageLink(): void;
}

function on(id: string, event: string, fn: () => void): void {
  document.getElementById(id)?.addEventListener(event, fn);
}

/** Wires the controls to the actions and sets the unit switch to `unit`. */
export function wireControls(
  unit: EnergyAxisUnit,
  actions: ControlActions,
): { setUnit(u: EnergyAxisUnit): void; setDrawable(d: boolean, pinnable?: boolean): void } {
  const select = document.getElementById('unit-select') as (HTMLElement & { value: string }) | null;
  const setUnit = (u: EnergyAxisUnit): void => {
    if (select && select.value !== u) select.value = u;
  };
  setUnit(unit);
  select?.addEventListener('change', () => {
    const v = select.value;
    if ((ENERGY_AXIS_UNITS as readonly string[]).includes(v)) actions.unit(v as EnergyAxisUnit);
  });
  on('pin-button', 'click', () => actions.pin());
  on('export-png', 'click', () => actions.exportPng());
  on('export-csv', 'click', () => actions.exportCsv());
  on('copy-link', 'click', () => actions.copyImageLink());
  return {
    setUnit,
    /** Exports need a curve; pinning also works for a measurement plot (`pinnable`). */
    setDrawable(d: boolean, pinnable = d) {
      for (const id of ['export-png', 'export-csv', 'copy-link'])
        document.getElementById(id)?.toggleAttribute('disabled', !d);
      document.getElementById('pin-button')?.toggleAttribute('disabled', !pinnable);
    },
  };
}
