/** Content type for a file path; `application/octet-stream` when unknown (C3D, EDF, BDF, ...). */
export declare function mimeTypeFor(path: string): string;
