// Package data embeds n2pulse's data files — cross sections, swarm tables, molecular
// constants and example designs — so the binary runs anywhere. Every number in these files
// carries its source in the same file.
package data
