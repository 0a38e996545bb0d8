// Saves the chart on screen as a file: SVG (the drawing itself) or PNG (drawn onto a canvas at twice
// the screen size). The page's theme colours are CSS variables the file would not carry, so every
// element's computed fill, stroke and font are written onto the copy.
const copied = ['fill', 'stroke', 'stroke-width', 'stroke-dasharray', 'font-family', 'font-size', 'font-weight', 'opacity', 'text-anchor'] as const;

export function standaloneSvg(svg: SVGSVGElement, title: string): string {
  const clone = svg.cloneNode(true) as SVGSVGElement;
  const originals = [svg, ...svg.querySelectorAll('*')];
  const copies = [clone, ...clone.querySelectorAll('*')];
  originals.forEach((el, i) => {
    const style = getComputedStyle(el);
    const target = copies[i] as SVGElement;
    for (const prop of copied) {
      const value = style.getPropertyValue(prop);
      if (value) target.style.setProperty(prop, value);
    }
    for (const attr of ['fill', 'stroke']) if (target.getAttribute(attr)?.includes('var(')) target.removeAttribute(attr);
  });
  const { width, height } = svg.getBoundingClientRect();
  clone.setAttribute('xmlns', 'http://www.w3.org/2000/svg');
  clone.setAttribute('width', String(Math.round(width)));
  clone.setAttribute('height', String(Math.round(height)));
  const background = document.createElementNS('http://www.w3.org/2000/svg', 'rect');
  background.setAttribute('width', '100%');
  background.setAttribute('height', '100%');
  background.setAttribute('fill', getComputedStyle(svg.closest('[data-testid="chart-panel"]') ?? document.body).backgroundColor || '#ffffff');
  clone.insertBefore(background, clone.firstChild);
  const heading = document.createElementNS('http://www.w3.org/2000/svg', 'title');
  heading.textContent = title;
  clone.insertBefore(heading, clone.firstChild);
  return new XMLSerializer().serializeToString(clone);
}

function download(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export function downloadSvg(svg: SVGSVGElement, title: string, fileName: string) {
  download(new Blob([standaloneSvg(svg, title)], { type: 'image/svg+xml' }), fileName);
}

export async function downloadPng(svg: SVGSVGElement, title: string, fileName: string): Promise<void> {
  const text = standaloneSvg(svg, title);
  const { width, height } = svg.getBoundingClientRect();
  const image = new Image();
  image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(text)}`;
  await image.decode();
  const scale = 2;
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(width * scale);
  canvas.height = Math.round(height * scale);
  const context = canvas.getContext('2d');
  if (!context) throw new Error('this browser cannot draw the chart onto a canvas');
  context.scale(scale, scale);
  context.drawImage(image, 0, 0, width, height);
  const blob = await new Promise<Blob | null>((resolve) => canvas.toBlob(resolve, 'image/png'));
  if (!blob) throw new Error('the browser could not make a PNG of the chart');
  download(blob, fileName);
}
