/**
 * A PNG of the map made in the browser: the map's SVG (presentation attributes only, no
 * outside fonts or images) drawn onto a canvas at twice the size. No request leaves the page.
 */
export async function downloadMapPng(doc: { svg: string; width: number; height: number }, fileName: string): Promise<void> {
  const scale = Math.min(2, 8000 / Math.max(doc.width, doc.height));
  const url = URL.createObjectURL(new Blob([doc.svg], { type: 'image/svg+xml' }));
  try {
    const img = new Image();
    await new Promise<void>((resolve, reject) => {
      img.onload = () => resolve();
      img.onerror = () => reject(new Error('The map picture could not be drawn.'));
      img.src = url;
    });
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(doc.width * scale);
    canvas.height = Math.round(doc.height * scale);
    const ctx = canvas.getContext('2d')!;
    ctx.scale(scale, scale);
    ctx.drawImage(img, 0, 0, doc.width, doc.height);
    const png = await new Promise<Blob>((resolve, reject) =>
      canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('No PNG'))), 'image/png'),
    );
    const a = document.createElement('a');
    a.href = URL.createObjectURL(png);
    a.download = fileName.replace(/[\\/:*?"<>|]/g, '_');
    document.body.append(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(a.href), 10_000);
  } finally {
    URL.revokeObjectURL(url);
  }
}
