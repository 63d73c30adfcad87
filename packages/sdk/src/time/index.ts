// Filled in by the time module work; see DEVELOPERS.md.
export {};
