module github.com/lctkit/lctkit

go 1.26

require (
	github.com/alecthomas/kong v1.17.0
	gonum.org/v1/gonum v0.17.0
)
