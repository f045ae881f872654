import { describe, expect, it } from 'vitest';
import { componentBoundingBox } from './component-bounding-box';
import { labelComponents } from './label-components';

function lehmer(seed: number) {
  let state = seed;
  return () => (state = (state * 48271) % 2147483647) / 2147483647;
}

describe('componentBoundingBox', () => {
  it('gives, for every foreground pixel, the box labelComponents gives its 8-connected component', () => {
    const random = lehmer(5);
    for (let trial = 0; trial < 30; trial++) {
      const width = 20 + Math.floor(40 * random());
      const height = 15 + Math.floor(30 * random());
      const density = 0.2 + 0.4 * random();
      const mask = Uint8Array.from({ length: width * height }, () => (random() < density ? 1 : 0));
      const { labels, components } = labelComponents(mask, { width, height });
      for (let index = 0; index < mask.length; index += 7) {
        const box = componentBoundingBox(mask, { width, height }, index);
        if (!mask[index]) {
          expect(box).toBeNull();
          continue;
        }
        expect(box).toEqual(components[labels[index] - 1].boundingBox);
      }
    }
  });

  it('joins pixels that touch only at a corner, as 8-connectivity does', () => {
    const mask = Uint8Array.from([1, 0, 0, 0, 1, 0, 0, 0, 1]);
    expect(componentBoundingBox(mask, { width: 3, height: 3 }, 0)).toEqual({ x: 0, y: 0, width: 3, height: 3 });
  });
});
