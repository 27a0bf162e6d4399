// An exported plot legible on its own in either theme: the theme's background painted behind it (the plot itself is
// transparent) and its caption (file, channel, the fit in one line) above it; as SVG text, or rasterised to PNG.

import type { PlotCaption } from '../core/report/plotCaption';
import { BenchError } from './benchError';

const SVG_NS = 'http://www.w3.org/2000/svg';
/** Height of the caption band above the plot, CSS px: two lines of 13 px text with their spacing. */
const CAPTION_HEIGHT = 46;
const CAPTION_LEFT = 14;
/** PNG pixels per CSS pixel: sharp on a high-density screen and in a printed report. */
export const PNG_SCALE = 2;

export interface ImageColors {
  background: string;
  ink: string;
  muted: string;
  font: string;
}

/** The plot's SVG inside a larger one: background rectangle, caption lines, then the plot below the caption. */
export function captionedSvg(plotSvg: string, caption: PlotCaption, colors: ImageColors): string {
  const plot = new DOMParser().parseFromString(plotSvg, 'image/svg+xml').documentElement;
  if (plot.nodeName !== 'svg') throw new BenchError('the plot did not export as SVG');
  const width = Number(plot.getAttribute('width'));
  const height = Number(plot.getAttribute('height'));
  const doc = document.implementation.createDocument(SVG_NS, 'svg', null);
  const root = doc.documentElement;
  const set = (element: Element, attributes: Record<string, string | number>) => {
    for (const [name, value] of Object.entries(attributes)) element.setAttribute(name, String(value));
    return element;
  };
  set(root, { width, height: height + CAPTION_HEIGHT, viewBox: `0 0 ${width} ${height + CAPTION_HEIGHT}` });
  root.append(set(doc.createElementNS(SVG_NS, 'rect'), { x: 0, y: 0, width, height: height + CAPTION_HEIGHT, fill: colors.background }));
  const line = (text: string, y: number, fill: string, weight: string) => {
    const element = set(doc.createElementNS(SVG_NS, 'text'), { x: CAPTION_LEFT, y, fill, 'font-family': colors.font, 'font-size': 13, 'font-weight': weight });
    element.textContent = text;
    return element;
  };
  root.append(line(caption.source, 18, colors.ink, '600'), line(caption.fit, 37, colors.muted, '400'));
  plot.setAttribute('y', String(CAPTION_HEIGHT));
  root.append(doc.importNode(plot, true));
  return new XMLSerializer().serializeToString(doc);
}

/** The captioned SVG drawn on a canvas at PNG_SCALE: a PNG as base64 (no data-URL prefix). */
export async function svgToPngBase64(svg: string): Promise<string> {
  const blob = await svgToPngBlob(svg);
  const bytes = new Uint8Array(await blob.arrayBuffer());
  let binary = '';
  for (let i = 0; i < bytes.length; i += 0x8000) binary += String.fromCharCode(...bytes.subarray(i, i + 0x8000));
  return btoa(binary);
}

export async function svgToPngBlob(svg: string): Promise<Blob> {
  const image = new Image();
  image.src = `data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`;
  await image.decode();
  const canvas = document.createElement('canvas');
  canvas.width = Math.round(image.width * PNG_SCALE);
  canvas.height = Math.round(image.height * PNG_SCALE);
  const context = canvas.getContext('2d');
  if (!context) throw new BenchError('no canvas to draw the PNG on');
  context.scale(PNG_SCALE, PNG_SCALE);
  context.drawImage(image, 0, 0);
  return new Promise((resolve, reject) => canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new BenchError('the PNG could not be made'))), 'image/png'));
}
