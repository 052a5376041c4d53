package web

import (
	"bytes"
	"net"
)

// SecureListener wraps ln so that the few answers net/http writes itself,
// before any handler runs (400 for a malformed request, 431 for headers
// over the server's limit, 501 for an unknown transfer coding), carry the
// app's security headers as every other answer does. net/http writes each
// such answer in one write, a status line followed by exactly its own two
// headers (errorHeaders in net/http's server.go); the connection inserts
// the app's headers after that status line and passes every other write
// through untouched.
func SecureListener(ln net.Listener) net.Listener { return secureListener{ln} }

type secureListener struct{ net.Listener }

func (l secureListener) Accept() (net.Conn, error) {
	c, err := l.Listener.Accept()
	if err != nil {
		return nil, err
	}
	return secureConn{c}, nil
}

type secureConn struct{ net.Conn }

// serverErrorHeaders are the headers net/http gives the answers it writes
// itself.
var serverErrorHeaders = []byte("\r\nContent-Type: text/plain; charset=utf-8\r\nConnection: close\r\n\r\n")

func (c secureConn) Write(p []byte) (int, error) {
	if !bytes.HasPrefix(p, []byte("HTTP/1.1 ")) {
		return c.Conn.Write(p)
	}
	end := bytes.Index(p, []byte("\r\n"))
	if end < 0 || !bytes.HasPrefix(p[end:], serverErrorHeaders) {
		return c.Conn.Write(p)
	}
	var out bytes.Buffer
	out.Write(p[:end])
	for _, kv := range securityHeaderList {
		out.WriteString("\r\n" + kv[0] + ": " + kv[1])
	}
	out.Write(p[end:])
	if _, err := c.Conn.Write(out.Bytes()); err != nil {
		return 0, err
	}
	return len(p), nil
}

// CloseWrite keeps the half-close net/http uses after a 431, so that the
// client reads the answer before the connection ends.
func (c secureConn) CloseWrite() error {
	if cw, ok := c.Conn.(interface{ CloseWrite() error }); ok {
		return cw.CloseWrite()
	}
	return nil
}
