// dcmjs ships no type declarations; it is used only by the fixture scripts.
declare module 'dcmjs';
