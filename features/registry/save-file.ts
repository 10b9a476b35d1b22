import { File, Paths } from 'expo-file-system';

/** Hands a text file to the person: on a phone, written to the app's documents folder. */
export async function saveTextFile(name: string, text: string, _mimeType: string): Promise<string> {
  const file = new File(Paths.document, name);
  if (file.exists) file.delete();
  file.create();
  file.write(text);
  return `Saved ${name} to this device’s documents`;
}
