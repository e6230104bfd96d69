/**
 * Saving a chart as a file: the on-screen <svg> is cloned, theme variables are resolved to the
 * colours currently on screen (a saved file has no stylesheet), points drawn on a canvas layer are
 * written back as vector marks, and the result is offered as SVG or rasterised to PNG at 2×.
 */
import { shapePath, type PointShape } from '$lib/charts/cie1931';

const SVG_NS = 'http://www.w3.org/2000/svg';

export interface VectorMark {
	x: number;
	y: number;
	fill: string;
	shape: PointShape;
	area: number;
}

/** Replace every `var(--name)` in a string by the value of that custom property on `from`. */
export function resolveVars(value: string, from: Element): string {
	if (!value.includes('var(')) return value;
	const style = getComputedStyle(from);
	return value.replace(/var\((--[\w-]+)\s*(?:,\s*([^)]+))?\)/g, (_, name: string, fallback?: string) => {
		const v = style.getPropertyValue(name).trim();
		return v || fallback?.trim() || 'currentColor';
	});
}

/**
 * A standalone SVG document of `svg`: variables resolved, interactive attributes removed, the
 * canvas layer's placeholder (<g data-canvas-layer>) filled with `marks` drawn as paths, the
 * `overlay` SVG drawn above the canvas (if any) appended on top, and a background in the page's
 * surface colour.
 */
export function serializeChart(svg: SVGSVGElement, marks: readonly VectorMark[] = [], title = 'Chart', overlay: SVGSVGElement | null = null): string {
	const clone = svg.cloneNode(true) as SVGSVGElement;
	const root = document.documentElement;
	clone.removeAttribute('class');
	clone.removeAttribute('style');
	const vb = svg.viewBox.baseVal;
	if (vb && vb.width) {
		clone.setAttribute('width', String(vb.width));
		clone.setAttribute('height', String(vb.height));
	}
	if (overlay) for (const child of overlay.childNodes) clone.appendChild(child.cloneNode(true));
	for (const el of [clone, ...clone.querySelectorAll('*')]) {
		for (const attr of [...el.attributes]) {
			if (attr.name === 'tabindex' || attr.name === 'role' || attr.name.startsWith('aria-') || attr.name.startsWith('data-')) {
				if (attr.name !== 'data-canvas-layer') el.removeAttribute(attr.name);
				continue;
			}
			if (attr.value.includes('var(')) el.setAttribute(attr.name, resolveVars(attr.value, svg));
		}
	}
	// Marks and labels are sized by a class rule on screen; a saved file carries the sizes itself.
	const u = Number(getComputedStyle(svg).getPropertyValue('--u')) || 1;
	for (const el of clone.querySelectorAll('.mark')) el.setAttribute('transform', `scale(${u})`);
	for (const el of clone.querySelectorAll('.mark-label')) {
		el.setAttribute('font-size', String(11 * u));
		el.setAttribute('stroke-width', String(3 * u));
	}
	const layer = clone.querySelector('[data-canvas-layer]');
	if (layer) {
		const g = document.createElementNS(SVG_NS, 'g');
		const clip = layer.getAttribute('clip-path');
		if (clip) g.setAttribute('clip-path', clip);
		const stroke = resolveVars('var(--cs-ink-muted)', root);
		for (const m of marks) {
			const p = document.createElementNS(SVG_NS, 'path');
			p.setAttribute('d', shapePath(m.shape, m.area));
			p.setAttribute('transform', `translate(${m.x.toFixed(2)},${m.y.toFixed(2)})`);
			p.setAttribute('fill', m.fill);
			p.setAttribute('stroke', stroke);
			p.setAttribute('stroke-width', '0.6');
			g.appendChild(p);
		}
		layer.replaceWith(g);
	}
	const bg = document.createElementNS(SVG_NS, 'rect');
	bg.setAttribute('x', '0');
	bg.setAttribute('y', '0');
	bg.setAttribute('width', '100%');
	bg.setAttribute('height', '100%');
	bg.setAttribute('fill', resolveVars('var(--cs-surface)', root));
	clone.insertBefore(bg, clone.firstChild);
	const t = document.createElementNS(SVG_NS, 'title');
	t.textContent = title;
	clone.insertBefore(t, clone.firstChild);
	clone.setAttribute('font-family', 'Inter Variable, system-ui, sans-serif');
	let text = new XMLSerializer().serializeToString(clone);
	// Serializers add the SVG namespace for an element created in it; make sure a file always has it.
	if (!/^<svg[^>]*\sxmlns="/.test(text)) text = text.replace(/^<svg/, `<svg xmlns="${SVG_NS}"`);
	return `<?xml version="1.0" encoding="UTF-8"?>\n${text}`;
}

function download(blob: Blob, fileName: string): void {
	const url = URL.createObjectURL(blob);
	const a = document.createElement('a');
	a.href = url;
	a.download = fileName;
	document.body.appendChild(a);
	a.click();
	a.remove();
	setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function downloadSvg(source: string, fileName: string): void {
	download(new Blob([source], { type: 'image/svg+xml' }), fileName);
}

/** Rasterise an SVG document (`width` × `height` user units) to a PNG blob at `scale`×. */
export async function svgToPng(source: string, width: number, height: number, scale = 2): Promise<Blob> {
	const url = URL.createObjectURL(new Blob([source], { type: 'image/svg+xml' }));
	try {
		const img = new Image();
		img.decoding = 'async';
		await new Promise<void>((resolve, reject) => {
			img.onload = () => resolve();
			img.onerror = () => reject(new Error('The chart could not be drawn as an image.'));
			img.src = url;
		});
		const canvas = document.createElement('canvas');
		canvas.width = Math.round(width * scale);
		canvas.height = Math.round(height * scale);
		const ctx = canvas.getContext('2d');
		if (!ctx) throw new Error('This browser cannot draw to a canvas.');
		ctx.drawImage(img, 0, 0, canvas.width, canvas.height);
		return await new Promise<Blob>((resolve, reject) =>
			canvas.toBlob((b) => (b ? resolve(b) : reject(new Error('The PNG could not be encoded.'))), 'image/png')
		);
	} finally {
		URL.revokeObjectURL(url);
	}
}

export async function downloadPng(source: string, width: number, height: number, fileName: string): Promise<void> {
	download(await svgToPng(source, width, height), fileName);
}
