/**
 * The chart as a standalone image: the recharts <svg> serialised with its size, a background and
 * the font it was drawn in (page CSS does not travel with the file), and a PNG drawn from that
 * SVG on a canvas at twice the size for sharp text.
 */
const SVG_NS = 'http://www.w3.org/2000/svg';

export function svgMarkup(svg: SVGSVGElement, options: { background: string; title: string }): string {
  const { width, height } = svg.getBoundingClientRect();
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute('xmlns', SVG_NS);
  clone.setAttribute('width', String(Math.round(width)));
  clone.setAttribute('height', String(Math.round(height)));
  clone.setAttribute('viewBox', `0 0 ${Math.round(width)} ${Math.round(height)}`);
  clone.setAttribute('font-family', getComputedStyle(svg).fontFamily || 'sans-serif');
  clone.setAttribute('font-size', '11');
  const title = document.createElementNS(SVG_NS, 'title');
  title.textContent = options.title;
  const background = document.createElementNS(SVG_NS, 'rect');
  background.setAttribute('width', '100%');
  background.setAttribute('height', '100%');
  background.setAttribute('fill', options.background);
  clone.insertBefore(background, clone.firstChild);
  clone.insertBefore(title, clone.firstChild);
  // Interactive overlays (tooltip cursor, brush handles' hit areas) add nothing to a picture.
  clone.querySelectorAll('.recharts-tooltip-cursor').forEach((node) => node.remove());
  return `<?xml version="1.0" encoding="UTF-8"?>\n${new XMLSerializer().serializeToString(clone)}\n`;
}

export async function pngOfSvg(markup: string, width: number, height: number, scale = 2): Promise<Blob> {
  // A data: URL (not blob:) keeps the canvas untainted and fits the page's img-src policy.
  const image = new Image();
  image.src = `data:image/svg+xml;base64,${base64Of(markup)}`;
  await image.decode();
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const context = canvas.getContext('2d');
  if (!context) throw new Error('This browser cannot draw on a canvas.');
  context.scale(scale, scale);
  context.drawImage(image, 0, 0, width, height);
  return new Promise((resolve, reject) => canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new Error('The PNG could not be made.'))), 'image/png'));
}

function base64Of(text: string): string {
  const bytes = new TextEncoder().encode(text);
  let binary = '';
  for (let index = 0; index < bytes.length; index += 0x8000) binary += String.fromCharCode(...bytes.subarray(index, index + 0x8000));
  return btoa(binary);
}
