import { useId } from 'react';
import { View } from 'react-native';
import { colors, fonts, space } from '../theme';
import { AppText } from '../ui/text';

export const canPickFiles = true;

/** The browser's own file input: read as text here, sent as the request body. */
export function CsvFileInput({
  onFile,
  disabled,
}: {
  onFile: (file: { name: string; text: string }) => void;
  disabled?: boolean;
}) {
  const id = useId();
  return (
    <View style={{ gap: space.xs }}>
      <AppText variant="label" nativeID={`${id}-label`}>
        Choose a CSV file
      </AppText>
      <input
        type="file"
        accept=".csv,text/csv,text/plain"
        aria-labelledby={`${id}-label`}
        data-testid="import-file"
        disabled={disabled}
        style={{ fontFamily: fonts.regular, fontSize: 17, color: colors.ink, minHeight: 48 }}
        onChange={(event) => {
          const input = event.currentTarget;
          const file = input.files?.[0];
          // Cleared, so choosing the same file again after a fix reads it again.
          input.value = '';
          if (file) void file.text().then((text) => onFile({ name: file.name, text }));
        }}
      />
    </View>
  );
}

export function saveTextFile(name: string, text: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: 'text/csv' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
