/** Follows an element's content width (whole pixels) for charts drawn 1:1 with the screen. */
export function watchWidth(el: HTMLElement, onwidth: (width: number) => void): () => void {
	if (typeof ResizeObserver === 'undefined') return () => {};
	const ro = new ResizeObserver((entries) => {
		const box = entries[entries.length - 1]?.contentBoxSize?.[0];
		onwidth(Math.round(box ? box.inlineSize : el.clientWidth));
	});
	ro.observe(el);
	return () => ro.disconnect();
}
