/** Pure playback scheduling shared by the browser player and offline renders. */
export * from './gm-drum-map';
export * from './rational';
export * from './schedule';
export * from './tempo-trainer';
export * from './position';
export * from './swing';
