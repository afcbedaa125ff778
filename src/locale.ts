/**
 * naive-ui's English texts with the generic placeholders ("Please Input", "Please Select",
 * "No Data") replaced by quieter ones, so a field without a placeholder of its own shows nothing
 * misleading and an empty table says so plainly.
 */
import { enUS, type NLocale } from 'naive-ui';

export const APP_LOCALE: NLocale = {
  ...enUS,
  Input: { ...enUS.Input, placeholder: '' },
  InputNumber: { ...enUS.InputNumber, placeholder: '' },
  Select: { ...enUS.Select, placeholder: 'Choose…' },
  Cascader: { ...enUS.Cascader, placeholder: 'Choose…' },
  Empty: { ...enUS.Empty, description: 'Nothing here yet' },
};
