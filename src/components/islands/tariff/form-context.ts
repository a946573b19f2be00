/** What every generated field needs besides react-hook-form: the currency for units, read-only mode. */
import { createContext, useContext } from 'react';

export type EditorContext = { currency: string; readOnly: boolean };
export const EditorCtx = createContext<EditorContext>({ currency: 'USD', readOnly: false });
export const useEditor = () => useContext(EditorCtx);

/** A DOM id for a field path (`rules.0.targetPf` -> `tf-rules-0-targetPf`). */
export const fieldId = (path: string) => `tf-${path.replace(/\./g, '-')}`;
