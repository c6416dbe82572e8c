/** Engine version, part of every result (others key cached results on it). Bump on any numerical change. */
export const ENGINE_VERSION = '1.1.0';
