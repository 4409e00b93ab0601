// Types for the `downsample-lttb` npm package (it ships none): the thesis author's
// reference LTTB function, used here as the test oracle.
declare module "downsample-lttb" {
  /** Returns the kept points (the same array elements), or `data` itself when threshold ≥ length or 0. */
  export function processData<P extends ArrayLike<number>>(data: P[], threshold: number): P[];
  const api: { processData: typeof processData };
  export default api;
}
