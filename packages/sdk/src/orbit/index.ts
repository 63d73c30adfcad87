// Filled in by the orbit module work; see DEVELOPERS.md.
export {};
