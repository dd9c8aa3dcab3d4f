/** Every command of the extension, in the `multiplet:` namespace. Menus and shortcuts: schema/plugin.json. */
export namespace CommandIDs {
  /** Insert a template cell of a kind below the active cell: `multiplet:insert-<kind>`. */
  export const insertPrefix = 'multiplet:insert-';
  export const rerunStale = 'multiplet:rerun-stale';
  export const saveState = 'multiplet:save-state';
  export const loadState = 'multiplet:load-state';
  export const refreshState = 'multiplet:refresh-state';
  export const showState = 'multiplet:show-state';
}
