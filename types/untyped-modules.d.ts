declare module 'dxf';
declare module 'gcode-parser';
declare module 'dxf-writer';
