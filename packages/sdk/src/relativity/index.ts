// Filled in by the relativity module work; see DEVELOPERS.md.
export {};
