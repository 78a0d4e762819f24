// The one wrapper around API calls made from components (STYLE habit 12): loading flag, the last
// error as a message, and field errors. 401 is handled once in the API client (session ends, back
// to sign-in), so callers only see it as an error here.
import { ref, type Ref } from 'vue';
import { ApiError, type ApiFieldError } from '../api/client';

/** State and runner of one asynchronous operation. */
export interface AsyncState<A extends unknown[], R> {
  loading: Ref<boolean>;
  error: Ref<string | null>;
  /** HTTP status of the last failure (0 = network), null when the last run succeeded. */
  status: Ref<number | null>;
  fieldErrors: Ref<ApiFieldError[]>;
  /** Runs the operation; resolves to its result, or to undefined when it failed (see `error`). */
  run: (...args: A) => Promise<R | undefined>;
}

/**
 * Wraps an async function with loading and error state.
 * @param fn - the operation, usually a store action or an `src/api` function.
 * @returns the reactive state and a `run` function.
 */
export function useAsync<A extends unknown[], R>(fn: (...args: A) => Promise<R>): AsyncState<A, R> {
  const loading = ref(false);
  const error = ref<string | null>(null);
  const status = ref<number | null>(null);
  const fieldErrors = ref<ApiFieldError[]>([]);
  async function run(...args: A): Promise<R | undefined> {
    loading.value = true;
    error.value = null;
    status.value = null;
    fieldErrors.value = [];
    try {
      return await fn(...args);
    } catch (cause) {
      if (cause instanceof ApiError) {
        error.value = cause.message;
        status.value = cause.status;
        fieldErrors.value = cause.fields;
      } else {
        error.value = cause instanceof Error ? cause.message : String(cause);
        status.value = -1;
      }
      return undefined;
    } finally {
      loading.value = false;
    }
  }
  return { loading, error, status, fieldErrors, run };
}
