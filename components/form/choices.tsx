import { type Control, Controller, type FieldValues, type Path } from 'react-hook-form';

import { ChoiceChips } from '@/components/choice-chips';
import { SelectField } from '@/components/select-field';

type Choice = { value: string; label: string; hint?: string };

/** One choice from a short list, as chips, bound to a form field that holds the chosen value. */
export function FormChoice<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
  options,
}: {
  control: Control<T, unknown, TOut>;
  name: Path<T>;
  label: string;
  options: readonly Choice[];
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <ChoiceChips
          label={label}
          value={field.value}
          options={options}
          onChange={field.onChange}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}

/**
 * A choice from a longer list, bound to a form field; an empty value shows the placeholder. `onChosen`
 * runs after the field takes the new value, for a form whose other fields follow this one.
 */
export function FormSelect<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
  options,
  placeholder,
  onChosen,
}: {
  control: Control<T, unknown, TOut>;
  name: Path<T>;
  label: string;
  options: Choice[];
  placeholder?: string;
  onChosen?: (value: string) => void;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <SelectField
          label={label}
          value={field.value || null}
          options={options}
          placeholder={placeholder}
          onChange={(v) => {
            field.onChange(v);
            onChosen?.(v);
          }}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}
