// Package attitude is part of sunsight (see DEVELOPERS.md); its doc is written with its model.
package attitude
