import { createContext, useContext } from 'react';

/**
 * Whether colour may be used. Decided once at start-up from NO_COLOR, TERM=dumb and the terminal
 * (see src/cli/io.ts colourAllowed), because not every colour library honours NO_COLOR. Every
 * component that colours something also says it in characters, so turning colour off loses nothing.
 */
export const ColourContext = createContext<boolean>(false);

export function useColour(): boolean {
  return useContext(ColourContext);
}
