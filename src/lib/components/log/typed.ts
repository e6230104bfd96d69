/**
 * A text area's value as spread attributes: set only when there is text to show (a refill after a
 * refused save, or the text being edited). An empty value sets nothing, so what someone typed
 * before the page finished loading on a slow phone is not wiped when the page takes over.
 */
export function keepTyped(value: string | null | undefined): { value?: string } {
	return value ? { value } : {};
}
