import exifr from 'exifr';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import {
	HEIC_REFUSED,
	MAX_PHOTO_BYTES,
	PhotoRejection,
	THUMBNAIL_WIDTH,
	checkDeclaredFile,
	cleanImage,
	finalKeys,
	heicSupported,
	incomingKey,
	looksLikeHeic,
	megabytes,
	uploadRules
} from '../../../../src/lib/server/services/photos';
import { TEST_GPS_DECIMAL, heicLikeBytes, notAnImage, p3Jpeg, photoWithGps, photoWithXmpGps, photoWithoutGps, sidewaysJpeg } from './images';

async function rejection(p: Promise<unknown>): Promise<PhotoRejection> {
	try {
		await p;
	} catch (e) {
		if (e instanceof PhotoRejection) return e;
		throw e;
	}
	throw new Error('expected a PhotoRejection');
}

function declaredRejection(f: { filename: string; type: string; size: number }): PhotoRejection {
	try {
		checkDeclaredFile(f);
	} catch (e) {
		if (e instanceof PhotoRejection) return e;
		throw e;
	}
	throw new Error('expected a PhotoRejection');
}

describe('checkDeclaredFile: what the browser says it will send', () => {
	it('takes JPEG, PNG and WebP by type, with the type the PUT must carry', () => {
		expect(checkDeclaredFile({ filename: 'wide.jpg', type: 'image/jpeg', size: 2_000_000 })).toEqual({ format: 'jpeg', contentType: 'image/jpeg' });
		expect(checkDeclaredFile({ filename: 'plot.png', type: 'image/png', size: 10 })).toEqual({ format: 'png', contentType: 'image/png' });
		expect(checkDeclaredFile({ filename: 'x.webp', type: 'IMAGE/WEBP', size: 10 })).toEqual({ format: 'webp', contentType: 'image/webp' });
		// Some older browsers say image/jpg or image/pjpeg (common practice in the wild).
		expect(checkDeclaredFile({ filename: 'x', type: 'image/pjpeg', size: 10 }).contentType).toBe('image/jpeg');
	});

	it('falls back on the extension only when the browser gives no type', () => {
		expect(checkDeclaredFile({ filename: 'IMG_0001.JPG', type: '', size: 10 }).format).toBe('jpeg');
		expect(checkDeclaredFile({ filename: 'diagram.png', type: 'application/octet-stream', size: 10 }).format).toBe('png');
		// A declared type wins over the name: a GIF named .jpg is still refused.
		expect(declaredRejection({ filename: 'fake.jpg', type: 'image/gif', size: 10 }).status).toBe(415);
	});

	it('refuses other types with 415 and a sentence naming the file and what is allowed', () => {
		const r = declaredRejection({ filename: 'diagram.gif', type: 'image/gif', size: 10 });
		expect(r.status).toBe(415);
		expect(r.code).toBe('unsupported_type');
		expect(r.message).toContain('“diagram.gif” is a file of type image/gif.');
		expect(r.message).toMatch(/JPEG, PNG or WebP/);
		expect(declaredRejection({ filename: 'notes', type: '', size: 10 }).message).toContain('unknown type');
	});

	it('refuses more than 15 MB with 413, saying how big it is and what to do', () => {
		expect(checkDeclaredFile({ filename: 'a.jpg', type: 'image/jpeg', size: MAX_PHOTO_BYTES }).format).toBe('jpeg');
		const r = declaredRejection({ filename: 'pano.jpg', type: 'image/jpeg', size: MAX_PHOTO_BYTES + 1 });
		expect(r.status).toBe(413);
		expect(r.code).toBe('too_large');
		expect(r.message).toContain('up to 15 MB');
		expect(r.message).toMatch(/Export a smaller JPEG/);
		expect(declaredRejection({ filename: 'big.jpg', type: 'image/jpeg', size: 18.4 * 1024 * 1024 }).message).toContain('18 MB');
	});

	it('refuses empty, negative and NaN sizes with 400', () => {
		for (const size of [0, -5, Number.NaN]) expect(declaredRejection({ filename: 'a.jpg', type: 'image/jpeg', size }).status).toBe(400);
	});

	it('refuses HEIC with a sentence telling the user to export JPEG when this sharp cannot read it', () => {
		if (heicSupported()) {
			expect(checkDeclaredFile({ filename: 'a.heic', type: 'image/heic', size: 10 }).format).toBe('heic');
			return;
		}
		for (const f of [
			{ filename: 'IMG_0002.HEIC', type: 'image/heic', size: 10 },
			{ filename: 'a.heif', type: 'image/heif', size: 10 },
			{ filename: 'IMG_0003.heic', type: '', size: 10 }
		]) {
			const r = declaredRejection(f);
			expect(r.status).toBe(415);
			expect(r.code).toBe('heic_unsupported');
			expect(r.message).toBe(HEIC_REFUSED);
		}
		expect(HEIC_REFUSED).toMatch(/Export the photo as JPEG/);
	});
});

describe('HEIC support in this build of sharp', () => {
	it('is detected from the HEIF loader: the prebuilt sharp reads AVIF but not HEVC-coded HEIC', async () => {
		// The prebuilt binaries leave out the patented HEVC codec (sharp maintainers, lovell/sharp#4050).
		const suffixes = sharp.format.heif.input.fileSuffix ?? [];
		expect(suffixes).toContain('.avif');
		expect(heicSupported()).toBe(suffixes.includes('.heic'));
		expect(heicSupported()).toBe(false);
		// Nor can it write HEVC, so a HEIC cannot even be made here to try.
		await expect(sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } }).heif({ compression: 'hevc' }).toBuffer()).rejects.toThrow();
		expect(uploadRules()).toEqual({ maxBytes: MAX_PHOTO_BYTES, types: ['image/jpeg', 'image/png', 'image/webp'], heic: false, heicMessage: HEIC_REFUSED });
	});

	it('looksLikeHeic reads the ftyp brands (ISO/IEC 23008-12 brands heic, heix; mif1 alone is not enough)', async () => {
		expect(looksLikeHeic(heicLikeBytes('heic', ['mif1', 'heic']))).toBe(true);
		expect(looksLikeHeic(heicLikeBytes('mif1', ['heic']))).toBe(true);
		expect(looksLikeHeic(heicLikeBytes('heix', []))).toBe(true);
		expect(looksLikeHeic(heicLikeBytes('mif1', ['avif']))).toBe(false);
		const avif = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#000' } }).avif().toBuffer();
		expect(looksLikeHeic(avif)).toBe(false);
		expect(looksLikeHeic(await photoWithoutGps())).toBe(false);
		expect(looksLikeHeic(new Uint8Array(4))).toBe(false);
	});

	it('refuses a HEIC file that arrives whatever it was called, with the export-JPEG sentence', async () => {
		const r = await rejection(cleanImage(heicLikeBytes()));
		expect(r.status).toBe(415);
		expect(r.message).toBe(HEIC_REFUSED);
	});
});

describe('cleanImage: decides from the bytes, strips location, keeps orientation', () => {
	it('finds GPS in a JPEG and leaves none (and no other EXIF) in the cleaned original', async () => {
		const input = await photoWithGps('jpeg', 1200, 900);
		expect(await exifr.gps(input)).toEqual(TEST_GPS_DECIMAL);
		const out = await cleanImage(input);
		expect(out.format).toBe('jpeg');
		expect(out.hadLocation).toBe(true);
		expect(out.original.contentType).toBe('image/jpeg');
		expect(out.original.extension).toBe('jpg');
		expect(await exifr.gps(Buffer.from(out.original.bytes))).toBeUndefined();
		expect(await exifr.parse(Buffer.from(out.original.bytes))).toBeUndefined();
		const meta = await sharp(out.original.bytes).metadata();
		expect(meta.exif).toBeUndefined();
		expect([meta.width, meta.height]).toEqual([1200, 900]);
	});

	it('makes a WebP thumbnail 480 px wide, never enlarged', async () => {
		const big = await cleanImage(await photoWithGps('jpeg', 1200, 900));
		const t = await sharp(big.thumbnail.bytes).metadata();
		expect(t.format).toBe('webp');
		expect([t.width, t.height]).toEqual([THUMBNAIL_WIDTH, 360]);
		expect([big.thumbnail.width, big.thumbnail.height]).toEqual([480, 360]);
		expect(t.exif).toBeUndefined();
		const small = await cleanImage(await photoWithoutGps('png', 200, 100));
		expect([small.thumbnail.width, small.thumbnail.height]).toEqual([200, 100]);
	});

	it('finds GPS in PNG and WebP (WebP through the EXIF block sharp reads) and strips it', async () => {
		for (const format of ['png', 'webp'] as const) {
			const out = await cleanImage(await photoWithGps(format));
			expect(out.format, format).toBe(format);
			expect(out.hadLocation, format).toBe(true);
			expect(out.original.contentType).toBe(`image/${format}`);
			expect((await sharp(out.original.bytes).metadata()).exif, format).toBeUndefined();
		}
	});

	it('reports no location for a photo without any', async () => {
		for (const format of ['jpeg', 'png', 'webp'] as const) expect((await cleanImage(await photoWithoutGps(format))).hadLocation, format).toBe(false);
	});

	it('finds GPS written in XMP and strips the XMP', async () => {
		const input = await photoWithXmpGps();
		expect((await sharp(input).metadata()).xmp).toBeDefined();
		const out = await cleanImage(input);
		expect(out.hadLocation).toBe(true);
		expect((await sharp(out.original.bytes).metadata()).xmp).toBeUndefined();
	});

	it('applies EXIF orientation 6 to the pixels (CIPA DC-008 Exif 2.32: 0th row is the visual right side; from memory)', async () => {
		const input = await sidewaysJpeg(64, 48);
		expect((await sharp(input).metadata()).orientation).toBe(6);
		const out = await cleanImage(input);
		const meta = await sharp(out.original.bytes).metadata();
		expect(meta.orientation).toBeUndefined();
		expect([out.original.width, out.original.height]).toEqual([48, 64]);
		// Stored left half (amber) becomes the top half once turned 90° clockwise.
		const { data, info } = await sharp(out.original.bytes).raw().toBuffer({ resolveWithObject: true });
		const at = (x: number, y: number) => Array.from(data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3));
		const [tr, , tb] = at(24, 8);
		const [br, , bb] = at(24, 56);
		expect(tr).toBeGreaterThan(180);
		expect(tb).toBeLessThan(120);
		expect(br).toBeLessThan(100);
		expect(bb).toBeGreaterThan(150);
	});

	it('keeps the colour profile of the original (a Display P3 photo stays P3) and gives the thumbnail sRGB', async () => {
		const input = await p3Jpeg();
		expect((await sharp(input).metadata()).icc).toBeDefined();
		const out = await cleanImage(input);
		expect((await sharp(out.original.bytes).metadata()).icc).toBeDefined();
		expect((await sharp(out.thumbnail.bytes).metadata()).icc).toBeUndefined();
	});

	it('rejects text named .jpg with 422 and a sentence', async () => {
		const r = await rejection(cleanImage(notAnImage()));
		expect(r.status).toBe(422);
		expect(r.code).toBe('not_an_image');
		expect(r.message).toMatch(/not a photo we can read/);
		expect(r.message).toMatch(/Export it as JPEG/);
	});

	it('rejects a JPEG cut short and an empty buffer', async () => {
		const whole = await photoWithoutGps('jpeg', 640, 480);
		expect((await rejection(cleanImage(whole.subarray(0, 300)))).code).toBe('not_an_image');
		expect((await rejection(cleanImage(new Uint8Array()))).code).toBe('not_an_image');
	});

	it('rejects images sharp can read but we do not take: SVG, GIF, AVIF, TIFF', async () => {
		const svg = new TextEncoder().encode('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>');
		const base = () => sharp({ create: { width: 8, height: 8, channels: 3, background: '#123456' } });
		const cases: [Uint8Array, string][] = [
			[svg, 'SVG'],
			[await base().gif().toBuffer(), 'GIF'],
			[await base().avif().toBuffer(), 'AVIF'],
			[await base().tiff().toBuffer(), 'TIFF']
		];
		for (const [bytes, name] of cases) {
			const r = await rejection(cleanImage(bytes));
			expect(r.status, name).toBe(415);
			expect(r.message, name).toContain(`in ${name} format`);
		}
	});

	it('refuses too many pixels with 413 before decoding (decompression bombs)', async () => {
		const r = await rejection(cleanImage(await photoWithoutGps('png', 64, 48), { maxPixels: 3000 }));
		expect(r.status).toBe(413);
		expect(r.code).toBe('too_many_pixels');
		expect(r.message).toContain('64 × 48 pixels');
		expect((await cleanImage(await photoWithoutGps('png', 64, 48), { maxPixels: 3072 })).original.width).toBe(64);
	});
});

describe('keys and sizes', () => {
	it('puts incoming files under incoming/ with an unguessable part, final ones under the project', () => {
		const a = incomingKey(7, 42);
		expect(a).toMatch(/^incoming\/7\/42-[0-9a-f-]{36}$/);
		expect(incomingKey(7, 42)).not.toBe(a);
		expect(finalKeys(7, 42, 'jpg')).toEqual({ original: 'projects/7/photos/42/original.jpg', thumbnail: 'projects/7/photos/42/thumbnail.webp' });
	});

	it('writes sizes in MB as a person would read them', () => {
		expect(megabytes(15 * 1024 * 1024)).toBe('15 MB');
		expect(megabytes(2.44 * 1024 * 1024)).toBe('2.4 MB');
		expect(megabytes(0)).toBe('0 MB');
	});
});
