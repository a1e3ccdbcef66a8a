import { useEffect, useState } from 'react';
import { Image as KImage } from 'react-konva';

/**
 * One image on the canvas (a tile or the screen-size copy), loaded in an effect as Konva needs
 * (STACK.md: no Image objects during server rendering). Loaded images are shared across tiles of
 * the same address through a small cache, so panning back does not flash.
 */
const cache = new Map<string, HTMLImageElement>();

export function TileImage({ src, x, y, width, height }: { src: string; x: number; y: number; width: number; height: number }) {
	const [img, setImg] = useState<HTMLImageElement | null>(() => (cache.get(src)?.complete ? cache.get(src)! : null));
	useEffect(() => {
		const known = cache.get(src);
		if (known?.complete) return setImg(known);
		const el = known ?? new window.Image();
		if (!known) {
			el.src = src;
			cache.set(src, el);
			if (cache.size > 600) cache.delete(cache.keys().next().value!);
		}
		const done = () => setImg(el);
		el.addEventListener('load', done);
		return () => el.removeEventListener('load', done);
	}, [src]);
	return img ? <KImage image={img} x={x} y={y} width={width} height={height} listening={false} /> : null;
}
