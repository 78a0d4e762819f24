// A value that follows another one frame later: the plots take a new analysis result at once and
// are drawn in that frame; the tables, findings and form hints follow just after that frame is
// painted, so their re-render never delays the redrawn plots.
import { onBeforeUnmount, shallowRef, watch, type Ref, type ShallowRef } from 'vue';

/**
 * Runs `callback` after the next frame has been painted (a task queued from `requestAnimationFrame`);
 * on the next task where there is no `requestAnimationFrame`; after 100 ms when no frame comes (hidden tab).
 * @param callback - what to run.
 * @returns a function that cancels it.
 */
export function afterNextPaint(callback: () => void): () => void {
  if (typeof requestAnimationFrame !== 'function') {
    const timer = setTimeout(callback, 0);
    return () => clearTimeout(timer);
  }
  let frame: number | null = null;
  // A hidden page gets no frames: this timer makes the callback run anyway.
  let timer = setTimeout(() => { if (frame !== null) cancelAnimationFrame(frame); frame = null; callback(); }, 100);
  frame = requestAnimationFrame(() => {
    frame = null;
    clearTimeout(timer);
    timer = setTimeout(callback, 0);
  });
  return () => {
    clearTimeout(timer);
    if (frame !== null) cancelAnimationFrame(frame);
  };
}

/**
 * A shallow ref that takes `source`'s value after the next paint; several changes within one
 * frame give one update, with the newest value.
 * @param source - the value to follow.
 * @returns the follower (read-only by convention).
 */
export function useAfterPaint<T>(source: Ref<T>): ShallowRef<T> {
  const follower = shallowRef(source.value) as ShallowRef<T>;
  let cancel: (() => void) | null = null;
  watch(source, () => {
    if (cancel) return;
    cancel = afterNextPaint(() => {
      cancel = null;
      follower.value = source.value;
    });
  }, { flush: 'sync' });
  onBeforeUnmount(() => cancel?.());
  return follower;
}
