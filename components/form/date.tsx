import { type Control, Controller, type FieldValues, type Path } from 'react-hook-form';

import { DateField } from '@/components/date-field';

/**
 * A calendar date bound to a form field that holds YYYY-MM-DD, or null (an empty string is read as none,
 * as forms that once typed dates start with). The picker gives only real dates.
 */
export function FormDate<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
  hint,
  min,
  max,
}: {
  control: Control<T, unknown, TOut>;
  name: Path<T>;
  label: string;
  hint?: string;
  min?: string;
  max?: string;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <DateField
          label={label}
          hint={hint}
          value={typeof field.value === 'string' && field.value !== '' ? field.value : null}
          onChange={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          min={min}
          max={max}
        />
      )}
    />
  );
}
