// Package design is a nitrogen laser as the user describes it: the Design (channel, gas,
// circuit, switch, discharge, level constants, optics, spectroscopic overrides, numerics and
// the optional [build] section of plates, dielectric and rails), its defaults with their
// sources, the one registry of dotted keys ("gas.pressure", "build.rail_height") with their
// units and allowed ranges, and the reader of design files (TOML). Spreads lists the
// constants whose default has a published spread or an estimate's range, with that range, its
// distribution (uniform or log-uniform) and its source: what an uncertainty study samples.
//
// Everything here is text and numbers: a key is parsed, converted to SI once, checked against
// its range and stored. The physics that uses a design (the shot, the effective upper-level
// lifetime, the bench report of stresses) lives in package kinetics, which imports this one;
// this package never imports kinetics. The only model it calls is package build, to derive
// the circuit values a [build] section implies.
//
// Errors a user can cause are *KeyError values naming the key, the value as given and what is
// allowed.
package design
