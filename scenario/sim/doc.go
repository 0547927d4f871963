// Package sim is the simulation loop of sunsight: it streams a time grid through
// propagation, sun, shadow, attitude, sensor readings, albedo and estimation into
// streaming accumulators.
package sim
