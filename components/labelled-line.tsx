import { Text } from '@/components/text';

/** A short fact in running text: its label in small capitals, then the value ("DUE 3 May 2026"). */
export function LabelledLine({
  label,
  value,
  color,
  numberOfLines,
}: {
  label: string;
  value: string;
  color?: string;
  numberOfLines?: number;
}) {
  return (
    <Text variant="small" color={color} numberOfLines={numberOfLines}>
      <Text variant="label" muted>
        {label.toUpperCase()}{' '}
      </Text>
      {value}
    </Text>
  );
}
