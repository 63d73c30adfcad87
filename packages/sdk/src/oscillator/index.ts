// Filled in by the oscillator module work; see DEVELOPERS.md.
export {};
