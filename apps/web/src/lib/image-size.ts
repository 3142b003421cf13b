/** A picture's size in pixels, read by the browser, so points placed on it keep their places. */
export function imageSize(url: string): Promise<{ width: number; height: number }> {
  return new Promise((resolve, reject) => {
    const img = new Image();
    img.onload = () => resolve({ width: img.naturalWidth, height: img.naturalHeight });
    img.onerror = () => reject(new Error('The picture could not be read'));
    img.src = url;
  });
}
