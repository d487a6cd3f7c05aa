// One wording for printer and cutter settings, used by the stock shelf and the run log.
import type { CutterSettings, PrinterSettings } from '@shared/schemas/shop';

const join = (parts: Array<string | false>) => parts.filter(Boolean).join(' · ');

export const printerSettingsText = (p: PrinterSettings) =>
  join([p.paperSetting && `paper: ${p.paperSetting}`, p.quality && `quality: ${p.quality}`, p.colour && `colour: ${p.colour}`, p.other]);

export const cutterSettingsText = (c: CutterSettings) =>
  join([
    c.material && `material: ${c.material}`,
    c.pressure && `pressure ${c.pressure}`,
    `${c.passes} pass${c.passes === 1 ? '' : 'es'}`,
    c.blade && `blade: ${c.blade}`,
  ]);
