// Command netsteer places drivers, actuators and sensors on large networks
// and judges given designs by structural controllability.
//
// Run "netsteer help" for the list of commands.
package main
