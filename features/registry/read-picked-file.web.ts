import type { DocumentPickerAsset } from 'expo-document-picker';

/** The picked file's text. On the web the picker hands over the browser's File object. */
export async function readPickedFile(asset: DocumentPickerAsset): Promise<string> {
  if (asset.file) return asset.file.text();
  return (await fetch(asset.uri)).text();
}
