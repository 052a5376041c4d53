package rrc_test

import (
	"testing"

	"gridloom/grid/demo"
	"gridloom/grid/rrc"
)

func BenchmarkEncode(b *testing.B) {
	p, err := demo.Load("stadium")
	if err != nil {
		b.Fatal(err)
	}
	for b.Loop() {
		if _, err := rrc.Encode(p); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDecode(b *testing.B) {
	p, err := demo.Load("stadium")
	if err != nil {
		b.Fatal(err)
	}
	text, err := rrc.Encode(p)
	if err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(len(text)))
	for b.Loop() {
		if _, err := rrc.Decode(text); err != nil {
			b.Fatal(err)
		}
	}
}
