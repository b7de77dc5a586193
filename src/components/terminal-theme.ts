// The colours of the page's terminals (the Bench traffic pane, a session's capture): the ANSI
// colours their lines use, each lightened to at least 4.5:1 against the dark background (WCAG 2.1
// AA for 12 px text; ratios worked out with the WCAG relative-luminance formula).
import type { ITheme } from '@xterm/xterm';

export const terminalTheme: ITheme = {
  background: '#1f2a2e',
  foreground: '#f6f3ec',
  cursor: '#1f2a2e',
  selectionBackground: '#e0b84a',
  selectionForeground: '#1f2a2e',
  // dim (90): 5.8:1; frames (32): 6.9:1; warnings (31): 6.0:1; TX (33): 7.8:1; RX (36): 7.3:1.
  brightBlack: '#9aa5a8',
  green: '#7ec26a',
  red: '#f08a7a',
  yellow: '#e0b84a',
  cyan: '#6cc5c0',
};
