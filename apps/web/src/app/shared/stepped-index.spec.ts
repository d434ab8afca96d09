import { steppedIndex } from './stepped-index';

describe('steppedIndex', () => {
  it('steps forward with the right and down arrows, stopping at the last item', () => {
    expect(steppedIndex('ArrowRight', 2, 5)).toBe(3);
    expect(steppedIndex('ArrowDown', 2, 5)).toBe(3);
    expect(steppedIndex('ArrowRight', 4, 5)).toBe(4);
  });

  it('steps back with the left and up arrows, stopping at the first item', () => {
    expect(steppedIndex('ArrowLeft', 2, 5)).toBe(1);
    expect(steppedIndex('ArrowUp', 2, 5)).toBe(1);
    expect(steppedIndex('ArrowLeft', 0, 5)).toBe(0);
  });

  it('jumps to the first and the last item with Home and End', () => {
    expect(steppedIndex('Home', 3, 5)).toBe(0);
    expect(steppedIndex('End', 1, 5)).toBe(4);
  });

  it('leaves every other key alone', () => {
    for (const key of ['Enter', ' ', 'Tab', 'a', 'PageDown']) {
      expect(steppedIndex(key, 2, 5)).toBeNull();
    }
  });
});
