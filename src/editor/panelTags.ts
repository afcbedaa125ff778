/**
 * The field panel's devices offered as default tags (S1 = %IX1, K1 = %QX1 …), named by their
 * IEC 81346 reference designation. A contactor is both driven by an output and reporting on an
 * input through its auxiliary contact: the output takes the device's name (the coil is what a
 * rung drives) and the input gets `_AUX` (the 13-14 contact).
 */
import type { PanelLayout } from '@shared/field/layout';
import type { Tag } from '@shared/ladder/schema';

export function panelTags(panel: PanelLayout): Tag[] {
  const tags: Tag[] = [];
  for (const device of panel.devices) {
    if (device.drivenBy) tags.push({ name: device.id, address: device.drivenBy, comment: device.label });
    if (device.feeds) {
      const name = device.drivenBy ? `${device.id}_AUX` : device.id;
      const contact = device.contact ? ` (${device.contact})` : '';
      tags.push({ name, address: device.feeds, comment: `${device.label}${contact}` });
    }
  }
  return tags;
}

/** The panel tags not yet declared (by name, case-insensitive, or by address). */
export function missingPanelTags(panel: PanelLayout, declared: readonly Tag[]): Tag[] {
  const names = new Set(declared.map((t) => t.name.toUpperCase()));
  const addresses = new Set(declared.map((t) => t.address.toUpperCase()));
  return panelTags(panel).filter((t) => !names.has(t.name.toUpperCase()) && !addresses.has(t.address.toUpperCase()));
}
