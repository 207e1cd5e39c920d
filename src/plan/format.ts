// Values with their units for verdict messages (reports keep the numbers numeric).

import { formatFrequency, formatTime } from '../model/units';
import type { ValueUnit } from './limits';

export function formatValue(v: number, unit: ValueUnit): string {
  switch (unit) {
    case 's':
      return formatTime(v, 4);
    case 'Hz':
      return formatFrequency(v, 6);
    case '%':
      return `${Number(v.toPrecision(4))}%`;
    case 'count':
      return String(v);
  }
}
