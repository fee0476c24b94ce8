/**
 * Scales a camera photo down to at most `maxSide` pixels and re-encodes it as JPEG, so a yard photo is
 * a few hundred kilobytes on a slow connection rather than several megabytes.
 */
export async function shrinkPhoto(file: Blob, maxSide = 1600, quality = 0.8): Promise<Blob> {
  const bitmap = await createImageBitmap(file);
  const scale = Math.min(1, maxSide / Math.max(bitmap.width, bitmap.height));
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(bitmap.width * scale);
  canvas.height = Math.round(bitmap.height * scale);
  canvas.getContext('2d')!.drawImage(bitmap, 0, 0, canvas.width, canvas.height);
  bitmap.close();
  return new Promise((resolve, reject) => canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('the photo could not be encoded'))), 'image/jpeg', quality));
}
