// Package suggest guesses the name a user meant when a key, a value of a
// name list, a flag or a command is misspelt, for the error message that
// refuses it.
//
// # Model
//
// The allowed name at the smallest Levenshtein distance (V. I. Levenshtein,
// Binary codes capable of correcting deletions, insertions and reversals,
// Soviet Physics Doklady 10(8), 707, 1966), with a missing or spelt-out unit
// suffix counted as one edit, compared without case.
//
// # Assumptions
//
// A guess is offered only when it is the single closest name and within 1
// edit for names of up to four letters, 2 above (common practice, no
// source): a wrong guess would mislead more than none.
//
// # Accuracy
//
// Not applicable: the hint only adds to a message; the input is refused
// either way.
//
// # References
//
// Levenshtein 1966 (above).
package suggest
