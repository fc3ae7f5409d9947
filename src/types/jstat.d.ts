// jstat ships no type declarations; it is imported as `import pkg from 'jstat'; const { jStat } = pkg;`.
declare module 'jstat';
