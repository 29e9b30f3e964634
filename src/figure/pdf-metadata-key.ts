/** The PDF Info key that carries a figure's metadata JSON (the same text a plate's PNG carries). */
export const PDF_METADATA_KEY = 'QuadatlasSheet';
