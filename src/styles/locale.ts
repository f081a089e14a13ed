import { enUS, type NLocale } from 'naive-ui';

/**
 * Naive UI's English wording with our own placeholders: an empty input shows nothing unless the screen gives a
 * meaningful placeholder of its own (never a generic "Please Input"), and an empty choice asks to choose.
 */
export const appLocale: NLocale = {
  ...enUS,
  Input: { ...enUS.Input, placeholder: '' },
  InputNumber: { ...enUS.InputNumber, placeholder: '' },
  Select: { ...enUS.Select, placeholder: 'Choose…' },
  Cascader: { ...enUS.Cascader, placeholder: 'Choose…' },
  DatePicker: { ...enUS.DatePicker, datePlaceholder: 'YYYY-MM-DD' },
};
