import { useEffect, useState } from 'react';

const cache = new Map<string, HTMLImageElement>();

/** Loads an image once per URL for Konva; undefined until it has loaded. */
export function useImage(url: string | undefined): HTMLImageElement | undefined {
  const [image, setImage] = useState<HTMLImageElement | undefined>(() => (url ? cache.get(url) : undefined));
  useEffect(() => {
    if (!url) return;
    const known = cache.get(url);
    if (known?.complete) {
      setImage(known);
      return;
    }
    const img = known ?? new window.Image();
    const done = () => setImage(img);
    img.addEventListener('load', done);
    if (!known) {
      img.src = url;
      cache.set(url, img);
    }
    return () => img.removeEventListener('load', done);
  }, [url]);
  return image;
}
