// Isomorphic: how long a signed link to an application's document works (the server signs with it).
export const DOCUMENT_LINK_MINUTES = 5;
