// Package study runs the model of package kinetics over many designs: sweeps of any numeric
// design key on a grid (one key gives curves, two give maps, more give a table), channel-length
// scans with the useful length, and the bookkeeping that lets a long sweep survive being killed
// and be split over machines.
//
// A sweep is a set of points, the Cartesian product of its axes (the last axis varies fastest);
// point i has the grid indices of i written in the mixed radix of the axis sizes. Points are
// independent: a pool of workers (one per CPU by default) computes them in any order, and each
// finished point is appended to a journal file (journal.jsonl) and flushed to disk (fsync) before
// the next is recorded, so a killed sweep loses at most the points in flight. The sweep's grid and
// a hash of its base design are kept in sweep.json; a resumed sweep must match them and computes
// only the points the journal lacks. The final table, results.csv, is always written from the
// journal in point order, so an interrupted and resumed sweep gives the same bytes as an
// uninterrupted one.
//
// Sharding: shard K of N (K = 1…N) owns the points i with i mod N = K−1. Shards write their own
// directories; Merge joins them, checking that every point is present exactly once and that all
// shards swept the same design on the same grid.
//
// Table columns: "point" (the index), one column per varied key headed "key [SI unit]", one per
// figure of merit of kinetics.Summary named by its JSON tag (derived by reflection, so the table
// follows the Summary), and "status" ("ok", "truncated" when the pulse outlasted the longest run a point may
// take, or "failed: <error>"). Numbers are written in SI with
// the shortest decimal that reads back to the same float64.
//
// Length scans (Length) run the design over channel lengths and mark the useful length: where
// the pulse energy first reaches 90 % of its plateau, or where it peaks when it falls again. The
// transit-time estimate beside it is c·τ_g with τ_g the inversion duration (FWHM of the
// channel-mean gain): light leaving the rear as the gain appears reaches the output end at
// most c·τ_g later, so length past that adds little (a rule of the trade, no source).
package study
