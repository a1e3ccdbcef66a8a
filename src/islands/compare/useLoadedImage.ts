import { useEffect, useState } from 'react';

/** An image element once it has loaded (Konva and the warp need decoded pixels), or null until then. */
export function useLoadedImage(src: string | null): HTMLImageElement | null {
	const [img, setImg] = useState<HTMLImageElement | null>(null);
	useEffect(() => {
		setImg(null);
		if (!src) return;
		const el = new window.Image();
		const done = () => setImg(el);
		el.addEventListener('load', done);
		el.src = src;
		return () => el.removeEventListener('load', done);
	}, [src]);
	return img;
}
