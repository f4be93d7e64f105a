import { registerDecorator, type ValidationArguments } from 'class-validator';
import {
  checkFlowRows,
  checkScheduleRows,
  problemLines,
  type TableProblem,
} from '@stillwell/shared/forecasts';

type Check = (value: unknown, field: string) => TableProblem[];

const checkOpenings: Check = (value, field) => {
  const out: TableProblem[] = [];
  if (!Array.isArray(value)) {
    return [{ field, row: 0, message: `${field}: must be a list of rows { id, opening }` }];
  }
  value.forEach((v: unknown, i) => {
    const row = i + 1;
    const r = (v ?? {}) as Record<string, unknown>;
    if (typeof r.id !== 'string' || r.id === '')
      out.push({
        field,
        row,
        column: 'id',
        message: `${field} row ${row} (id): name a gate or valve`,
      });
    if (typeof r.opening !== 'number' || !Number.isFinite(r.opening) || r.opening < 0)
      out.push({
        field,
        row,
        column: 'opening',
        message: `${field} row ${row} (opening): must be a number, not negative`,
      });
    const extra = Object.keys(r).filter((k) => k !== 'id' && k !== 'opening');
    if (extra.length)
      out.push({
        field,
        row,
        column: extra[0],
        message: `${field} row ${row} (${extra[0]}): unknown column`,
      });
  });
  return out;
};

/**
 * A property holding a table, checked row by row with the shared checks (the console runs the
 * same). The message lists the problems with their rows; the field's name starts each one.
 */
function tableOf(check: Check, name: string) {
  return () =>
    (target: object, propertyName: string): void => {
      registerDecorator({
        name,
        target: target.constructor,
        propertyName,
        validator: {
          validate: (value: unknown, args: ValidationArguments) =>
            check(value, args.property).length === 0,
          defaultMessage: (args: ValidationArguments) =>
            problemLines(check(args.value, args.property), 10).join('; '),
        },
      });
    };
}

export const IsFlowTable = tableOf(checkFlowRows, 'isFlowTable');
export const IsScheduleTable = tableOf((v, f) => checkScheduleRows(v, f), 'isScheduleTable');
export const IsOpeningTable = tableOf(checkOpenings, 'isOpeningTable');
