// Package polyhedron computes with Newton polyhedra in exact arithmetic.
package polyhedron
