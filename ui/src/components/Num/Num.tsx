import { formatNumber, fullPrecision, prettyUnit } from '../../lib/format.js';
import classes from './Num.module.css';

export interface NumProps {
  value: number | null | undefined;
  unit?: string;
  sig?: number;
  /** Right-align (table cells). */
  align?: 'left' | 'right';
}

/** A number as the ui shows it: tabular figures, 4 significant figures, unit beside, full value on hover. */
export function Num({ value, unit, sig = 4, align }: NumProps) {
  const u = prettyUnit(unit);
  const text = formatNumber(value, sig);
  return (
    <span className={classes.num} data-align={align} title={fullPrecision(value, unit)}>
      {text}
      {u && text !== '—' ? (
        <span className={classes.unit}>
          {'\u00a0'}
          {u}
        </span>
      ) : null}
    </span>
  );
}
