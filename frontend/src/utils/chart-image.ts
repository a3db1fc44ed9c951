// A drawn chart leaves the page as a file: its <svg> with the styles the page's CSS gave it written inline, and the
// PNG drawn from that file on a canvas. Written here rather than taken from a package: the free chart package has no
// image export, and each feature adds to the file what its chart does not draw (title, legend, the points' table).
// The work itself is the browser's: getComputedStyle, XMLSerializer, an image and a canvas.

// What the drawn chart looks like comes partly from the theme's stylesheet: copied onto each element.
const STYLE_PROPERTIES = [
  'fill',
  'fill-opacity',
  'stroke',
  'stroke-width',
  'stroke-opacity',
  'stroke-dasharray',
  'stroke-linecap',
  'stroke-linejoin',
  'opacity',
  'visibility',
  'display',
  'font-family',
  'font-size',
  'font-weight',
  'font-style',
  'text-anchor',
  'dominant-baseline',
  'alignment-baseline',
  'shape-rendering',
] as const;

/** Copies the computed style of `source` and of each of its descendants onto the same element of its clone `target`. */
export function inlineStyles(source: Element, target: Element): void {
  const computed = window.getComputedStyle(source);
  const declarations = STYLE_PROPERTIES.flatMap((property) => {
    const value = computed.getPropertyValue(property);
    return value ? [`${property}:${value}`] : [];
  });
  if (declarations.length > 0) target.setAttribute('style', `${declarations.join(';')};${target.getAttribute('style') ?? ''}`);
  const sourceChildren = source.children;
  const targetChildren = target.children;
  for (let i = 0; i < sourceChildren.length && i < targetChildren.length; i++) inlineStyles(sourceChildren[i]!, targetChildren[i]!);
}

const XML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&apos;' };

/** Text (or a number) as XML character data or an attribute value. */
export function escapeXml(text: string | number): string {
  return String(text).replace(/[&<>"']/g, (c) => XML_ESCAPES[c] ?? c);
}

/** Draws an SVG document on a canvas at `scale` (2: sharp on a high-density screen and in print) on white, and gives it back as PNG. */
export function svgToPng(svgText: string, scale = 2): Promise<Blob> {
  return new Promise<Blob>((resolve, reject) => {
    const url = URL.createObjectURL(new Blob([svgText], { type: 'image/svg+xml;charset=utf-8' }));
    const image = new Image();
    image.onload = () => {
      const canvas = document.createElement('canvas');
      canvas.width = Math.ceil(image.naturalWidth * scale);
      canvas.height = Math.ceil(image.naturalHeight * scale);
      const context = canvas.getContext('2d');
      if (!context) {
        URL.revokeObjectURL(url);
        reject(new Error('This browser cannot draw the image'));
        return;
      }
      context.fillStyle = '#ffffff';
      context.fillRect(0, 0, canvas.width, canvas.height);
      context.scale(scale, scale);
      context.drawImage(image, 0, 0);
      URL.revokeObjectURL(url);
      canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('The image could not be made'))), 'image/png');
    };
    image.onerror = () => {
      URL.revokeObjectURL(url);
      reject(new Error('The chart could not be drawn as an image'));
    };
    image.src = url;
  });
}
