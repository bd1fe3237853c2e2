/** Thrown for input the raster stage refuses or cannot handle: the message says why. */
export class RasterInputError extends Error {
  override readonly name = 'RasterInputError';
}
