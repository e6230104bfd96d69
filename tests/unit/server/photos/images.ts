/**
 * Small factories for test photos, built with sharp. The coordinates are invented (open sea in the
 * North Atlantic), written the way EXIF stores them: degrees, minutes, seconds as rationals.
 */
import sharp from 'sharp';

export const TEST_GPS = {
	GPSLatitudeRef: 'N',
	GPSLatitude: '40/1 30/1 0/1',
	GPSLongitudeRef: 'W',
	GPSLongitude: '30/1 15/1 0/1'
};
/** 40° 30′ N, 30° 15′ W in decimal degrees (west is negative). */
export const TEST_GPS_DECIMAL = { latitude: 40.5, longitude: -30.25 };

type Format = 'jpeg' | 'png' | 'webp';

/** A picture: left half amber, right half blue, so rotations can be told apart. */
export function picture(width = 64, height = 48) {
	const half = Math.floor(width / 2);
	return sharp({ create: { width, height, channels: 3, background: '#e9a23b' } }).composite([
		{ input: { create: { width: width - half, height, channels: 3, background: '#2040c0' } }, left: half, top: 0 }
	]);
}

export async function photoWithGps(format: Format = 'jpeg', width = 64, height = 48): Promise<Buffer> {
	const flat = await picture(width, height).png().toBuffer();
	return sharp(flat)[format]().withExif({ IFD0: { Make: 'Test camera', Software: 'test factory' }, IFD3: TEST_GPS }).toBuffer();
}

export async function photoWithoutGps(format: Format = 'jpeg', width = 64, height = 48): Promise<Buffer> {
	const flat = await picture(width, height).png().toBuffer();
	return sharp(flat)[format]().toBuffer();
}

/** A JPEG stored sideways with EXIF orientation 6 (display it turned 90° clockwise). */
export async function sidewaysJpeg(width = 64, height = 48): Promise<Buffer> {
	const flat = await picture(width, height).png().toBuffer();
	return sharp(flat).jpeg().withMetadata({ orientation: 6 }).toBuffer();
}

export async function photoWithXmpGps(): Promise<Buffer> {
	const xmp =
		'<?xpacket begin="" id="W5M0MpCehiHzreSzNTczkc9d"?><x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">' +
		'<rdf:Description rdf:about="" xmlns:exif="http://ns.adobe.com/exif/1.0/" exif:GPSLatitude="40,30.0N" exif:GPSLongitude="30,15.0W"/></rdf:RDF></x:xmpmeta><?xpacket end="w"?>';
	const flat = await picture().png().toBuffer();
	return sharp(flat).jpeg().withXmp(xmp).toBuffer();
}

/** A JPEG carrying a Display P3 colour profile. */
export async function p3Jpeg(): Promise<Buffer> {
	const flat = await picture().png().toBuffer();
	return sharp(flat).jpeg().withIccProfile('p3').toBuffer();
}

/** The first bytes of an HEIF file branded as HEIC (HEVC-coded), then filler. */
export function heicLikeBytes(major = 'heic', compatible = ['mif1', 'heic']): Uint8Array {
	const brands = [major, '\0\0\0\0', ...compatible].join('');
	const size = 8 + brands.length;
	const head = new Uint8Array(size + 64);
	new DataView(head.buffer).setUint32(0, size);
	head.set(new TextEncoder().encode('ftyp' + brands), 4);
	return head;
}

/** Plain text that claims nothing. */
export const notAnImage = () => new TextEncoder().encode('Gaffer notes: key at 3200 K, fill one stop under.\n'.repeat(20));
