// An exported plot legible on its own in either theme: the theme's background painted behind it (the plot itself is
// transparent) and its caption (file, channel, the fit in one line) above it; as SVG text, or rasterised to PNG.

import type { PlotCaption } from '../core/report/plotCaption';
import { escapeHtml } from '../core/report/escape';
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

/**
 * The plot's SVG inside a larger one: background rectangle, caption lines, then the plot below the caption. Built
 * as text: parsing the plot's markup into a document would apply its inline styles, which the page's CSP refuses.
 */
export function captionedSvg(plotSvg: string, caption: PlotCaption, colors: ImageColors): string {
  const open = /^<svg\b[^>]*>/.exec(plotSvg.trimStart());
  const width = Number(/\swidth="([\d.]+)"/.exec(open?.[0] ?? '')?.[1]);
  const height = Number(/\sheight="([\d.]+)"/.exec(open?.[0] ?? '')?.[1]);
  if (!open || !(width > 0) || !(height > 0)) throw new BenchError('the plot did not export as an SVG with its size');
  const total = height + CAPTION_HEIGHT;
  const line = (text: string, y: number, fill: string, weight: number) =>
    `<text x="${CAPTION_LEFT}" y="${y}" fill="${escapeHtml(fill)}" font-family="${escapeHtml(colors.font)}" font-size="13" font-weight="${weight}">${escapeHtml(text)}</text>`;
  const plot = plotSvg.trimStart().replace(/^<svg\b/, `<svg y="${CAPTION_HEIGHT}"`);
  return (
    `<svg xmlns="${SVG_NS}" width="${width}" height="${total}" viewBox="0 0 ${width} ${total}">` +
    `<rect x="0" y="0" width="${width}" height="${total}" fill="${escapeHtml(colors.background)}"/>` +
    line(caption.source, 18, colors.ink, 600) +
    line(caption.fit, 37, colors.muted, 400) +
    `${plot}</svg>`
  );
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
