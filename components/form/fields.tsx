import { useState } from 'react';
import { type Control, Controller, type FieldValues, type Path } from 'react-hook-form';

import { TextField } from '@/components/text-field';

/** Text as the API's nullable text fields take it: the field shows '' for null. */
export function FormText<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
  hint,
  multiline,
  placeholder,
  autoCapitalize,
  inputMode,
}: {
  control: Control<T, unknown, TOut>;
  name: Path<T>;
  label: string;
  hint?: string;
  multiline?: boolean;
  placeholder?: string;
  autoCapitalize?: 'none' | 'sentences' | 'words';
  inputMode?: 'text' | 'email' | 'tel';
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          ref={field.ref}
          label={label}
          hint={hint}
          value={typeof field.value === 'string' ? field.value : ''}
          onChangeText={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          multiline={multiline}
          numberOfLines={multiline ? 3 : undefined}
          placeholder={placeholder}
          autoCapitalize={autoCapitalize}
          inputMode={inputMode}
          style={multiline ? { minHeight: 72, textAlignVertical: 'top' } : undefined}
        />
      )}
    />
  );
}

/**
 * A number field. The text typed is kept as typed (so "19" on the way to "1998" and "2." stay on screen)
 * and the form holds its value: a number, null when empty, NaN when not a number, for the schema to
 * judge with its own message. The text starts from the form's value; later resets are not followed (no
 * form here resets a number from outside).
 */
export function FormNumber<T extends FieldValues, TOut extends FieldValues = T>({
  control,
  name,
  label,
  hint,
  unit,
  integer,
}: {
  control: Control<T, unknown, TOut>;
  name: Path<T>;
  label: string;
  hint?: string;
  unit?: string;
  integer?: boolean;
}) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <NumberText
          value={field.value as number | null | undefined}
          onChange={field.onChange}
          onBlur={field.onBlur}
          label={label}
          hint={hint}
          unit={unit}
          integer={integer}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}

function parseNumberText(text: string): number | null {
  const t = text.trim().replace(/\s/g, '');
  if (t === '') return null;
  return /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

function NumberText({
  value,
  onChange,
  onBlur,
  label,
  hint,
  unit,
  integer,
  error,
}: {
  value: number | null | undefined;
  onChange: (v: number | null) => void;
  onBlur: () => void;
  label: string;
  hint?: string;
  unit?: string;
  integer?: boolean;
  error?: string;
}) {
  const [text, setText] = useState(
    value === null || value === undefined || Number.isNaN(value) ? '' : String(value),
  );
  return (
    <TextField
      label={label}
      hint={hint}
      unit={unit}
      value={text}
      onChangeText={(t) => {
        setText(t);
        onChange(parseNumberText(t));
      }}
      onBlur={onBlur}
      error={error}
      inputMode={integer ? 'numeric' : 'decimal'}
      keyboardType={integer ? 'number-pad' : 'decimal-pad'}
    />
  );
}
