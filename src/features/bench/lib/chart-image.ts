/**
 * The chart as a standalone image: its <svg> serialised with its size, a background and
 * the font it was drawn in (page CSS does not travel with the file), and a PNG drawn from that
 * SVG on a canvas at twice the size for sharp text.
 */
const SVG_NS = 'http://www.w3.org/2000/svg';

/** One legend entry drawn above the exported chart: a line (dashed when `dash`) in its colour. */
export type LegendEntry = { label: string; colour: string; dash?: string };

/** Room above the chart for the title and the legend (px). */
export const EXPORT_HEADER_PX = 44;

/**
 * The exported picture carries what the page shows around the chart: the scenario's title, a
 * legend of the lines and marks, and (already inside the chart's SVG) the events and findings.
 */
export function svgMarkup(svg: SVGSVGElement, options: { background: string; title: string; legend?: readonly LegendEntry[]; textColour?: string }): string {
  const { width, height: chartHeight } = svg.getBoundingClientRect();
  const height = chartHeight + EXPORT_HEADER_PX;
  const clone = svg.cloneNode(true) as SVGSVGElement;
  clone.setAttribute('xmlns', SVG_NS);
  clone.setAttribute('width', String(Math.round(width)));
  clone.setAttribute('height', String(Math.round(height)));
  clone.setAttribute('viewBox', `0 0 ${Math.round(width)} ${Math.round(height)}`);
  // The chart moves down under a header with the title and the legend.
  const body = document.createElementNS(SVG_NS, 'g');
  body.setAttribute('transform', `translate(0 ${EXPORT_HEADER_PX})`);
  while (clone.firstChild) body.appendChild(clone.firstChild);
  clone.appendChild(body);
  const header = document.createElementNS(SVG_NS, 'g');
  header.setAttribute('data-export-header', '');
  const heading = document.createElementNS(SVG_NS, 'text');
  heading.setAttribute('x', '8');
  heading.setAttribute('y', '16');
  heading.setAttribute('font-size', '13');
  heading.setAttribute('font-weight', '600');
  heading.setAttribute('fill', options.textColour ?? '#0f172a');
  heading.textContent = options.title;
  header.appendChild(heading);
  let x = 8;
  for (const entry of options.legend ?? []) {
    const line = document.createElementNS(SVG_NS, 'line');
    line.setAttribute('x1', String(x));
    line.setAttribute('x2', String(x + 16));
    line.setAttribute('y1', '33');
    line.setAttribute('y2', '33');
    line.setAttribute('stroke', entry.colour);
    line.setAttribute('stroke-width', '2');
    if (entry.dash) line.setAttribute('stroke-dasharray', entry.dash);
    const label = document.createElementNS(SVG_NS, 'text');
    label.setAttribute('x', String(x + 20));
    label.setAttribute('y', '37');
    label.setAttribute('font-size', '11');
    label.setAttribute('fill', options.textColour ?? '#334155');
    label.textContent = entry.label;
    header.append(line, label);
    x += 28 + entry.label.length * 6.2;
  }
  clone.insertBefore(header, clone.firstChild);
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
