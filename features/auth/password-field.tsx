import { type Control, Controller, type FieldValues, type Path } from 'react-hook-form';

import { TextField } from '@/components/text-field';

/** A hidden password input bound to a form; `current` tells password managers which one to fill. */
export function PasswordField<T extends FieldValues>({
  control,
  name,
  label,
  hint,
  current,
  onSubmitEditing,
}: {
  control: Control<T>;
  name: Path<T>;
  label: string;
  hint?: string;
  current?: boolean;
  onSubmitEditing?: () => void;
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
          secureTextEntry
          autoCapitalize="none"
          autoCorrect={false}
          autoComplete={current ? 'current-password' : 'new-password'}
          textContentType={current ? 'password' : 'newPassword'}
          onSubmitEditing={onSubmitEditing}
        />
      )}
    />
  );
}
