// Package validation holds n2pulse's checks against values from outside the project —
// published measurements, handbook tables, analytic results, common practice of the trade and
// values recalled from memory — as data. Each check records what is compared, the value the
// model computes, the reference value, the tolerance, the source and the kind of source.
//
// Packages of the model do not import validation; validation calls the model as a user does.
// Each topic registers its checks in a file of its own with Register, in an init function.
// `go test ./validation` and `n2pulse check` run the same registry.
package validation
