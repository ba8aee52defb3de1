declare module 'dxf';
declare module 'gcode-parser';
