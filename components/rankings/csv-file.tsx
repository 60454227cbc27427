// Phones have no file input here (expo-document-picker is not installed): the import screen
// offers its paste box instead, and shows the template's header rather than saving a file.
export const canPickFiles = false;

export function CsvFileInput(_props: {
  onFile: (file: { name: string; text: string }) => void;
  disabled?: boolean;
}) {
  return null;
}

export function saveTextFile(_name: string, _text: string): void {}
