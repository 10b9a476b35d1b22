import { TextField } from '@/components/text-field';

/**
 * A list's search box: what is searched is names, serials and places, so no capitals or corrections are
 * forced on it, and the keyboard's action key says search.
 */
export function SearchField({
  label,
  placeholder,
  value,
  onChangeText,
}: {
  label: string;
  placeholder: string;
  value: string;
  onChangeText: (text: string) => void;
}) {
  return (
    <TextField
      label={label}
      placeholder={placeholder}
      value={value}
      onChangeText={onChangeText}
      autoCapitalize="none"
      autoCorrect={false}
      inputMode="search"
      returnKeyType="search"
    />
  );
}
