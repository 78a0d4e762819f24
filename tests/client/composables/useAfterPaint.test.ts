// useAfterPaint: the follower keeps the old value until the frame after a change has been
// painted, then takes the newest value once for a burst of changes.
import { describe, expect, it } from 'vitest';
import { defineComponent, h, ref } from 'vue';
import { mount } from '@vue/test-utils';
import { useAfterPaint } from '../../../src/composables/useAfterPaint';

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('useAfterPaint', () => {
  it('follows after the next frame, with the newest of several changes, and updates once', async () => {
    const source = ref(1);
    let follower!: ReturnType<typeof useAfterPaint<number>>;
    const seen: number[] = [];
    mount(defineComponent({ setup() { follower = useAfterPaint(source); return () => { seen.push(follower.value); return h('div'); }; } }));
    expect(follower.value).toBe(1);
    source.value = 2;
    source.value = 3;
    expect(follower.value).toBe(1); // not in the same task
    await Promise.resolve();
    expect(follower.value).toBe(1); // nor after the microtasks (the plots' flush)
    await sleep(120);
    expect(follower.value).toBe(3);
    expect(seen).toEqual([1, 3]); // one re-render for the burst
  });
});
