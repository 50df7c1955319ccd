package kernel

import (
	"bytes"
	"crypto/hmac"
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"errors"
	"fmt"
	"hash"
	"sync"
	"time"

	"github.com/google/uuid"
)

// ProtocolVersion is the Jupyter messaging protocol version spoken.
const ProtocolVersion = "5.3"

// delimiter separates routing identities from the signed part of a message.
var delimiter = []byte("<IDS|MSG>")

// Header is a message header as the messaging spec defines it.
type Header struct {
	MsgID    string `json:"msg_id"`
	Session  string `json:"session"`
	Username string `json:"username"`
	Date     string `json:"date"`
	MsgType  string `json:"msg_type"`
	Version  string `json:"version"`
}

// message is one decoded wire message. Raw parts are kept as received so a
// reply can echo the request header byte for byte as its parent_header.
type message struct {
	Identities [][]byte
	Header     Header
	RawHeader  json.RawMessage
	Parent     json.RawMessage
	Metadata   json.RawMessage
	Content    json.RawMessage
	Buffers    [][]byte
}

// signer computes and checks HMAC-SHA256 signatures and remembers the
// signatures already seen so that a replayed message is refused.
type signer struct {
	mu   sync.Mutex
	mac  hash.Hash // nil when the key is empty: signing disabled
	seen map[string]struct{}
	ring []string // insertion order of seen, for bounded eviction
	next int
}

// newSigner returns a signer for key remembering up to window signatures.
func newSigner(key string, window int) *signer {
	s := &signer{seen: make(map[string]struct{}, window), ring: make([]string, window)}
	if key != "" {
		s.mac = hmac.New(sha256.New, []byte(key))
	}
	return s
}

// sign returns the hex signature of the four signed frames ("" without key).
func (s *signer) sign(parts [4][]byte) []byte {
	if s.mac == nil {
		return nil
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	s.mac.Reset()
	for _, p := range parts {
		s.mac.Write(p)
	}
	sum := s.mac.Sum(nil)
	out := make([]byte, hex.EncodedLen(len(sum)))
	hex.Encode(out, sum)
	return out
}

// errSignature and errReplay are why a message was refused.
var (
	errSignature = errors.New("kernel: bad or missing signature; the client must sign with the connection file's key")
	errReplay    = errors.New("kernel: signature already seen; a replayed message is never executed")
)

// verify checks sig against parts in constant time and records it.
func (s *signer) verify(sig []byte, parts [4][]byte) error {
	if s.mac == nil {
		return nil
	}
	want := s.sign(parts)
	if !hmac.Equal(bytes.ToLower(sig), want) {
		return errSignature
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	k := string(want)
	if _, dup := s.seen[k]; dup {
		return errReplay
	}
	if old := s.ring[s.next]; old != "" {
		delete(s.seen, old)
	}
	s.ring[s.next] = k
	s.seen[k] = struct{}{}
	s.next = (s.next + 1) % len(s.ring)
	return nil
}

// decode splits frames into a message, checking the signature and size.
func decode(frames [][]byte, s *signer, limit int64) (*message, error) {
	var total int64
	for _, f := range frames {
		total += int64(len(f))
	}
	if limit > 0 && total > limit {
		return nil, fmt.Errorf("kernel: message of %d bytes exceeds the limit of %d bytes; send smaller messages or raise the limit", total, limit)
	}
	d := -1
	for i, f := range frames {
		if bytes.Equal(f, delimiter) {
			d = i
			break
		}
	}
	if d < 0 || len(frames) < d+6 {
		return nil, fmt.Errorf("kernel: malformed message of %d frames; want identities, <IDS|MSG>, signature, header, parent_header, metadata, content", len(frames))
	}
	parts := [4][]byte{frames[d+2], frames[d+3], frames[d+4], frames[d+5]}
	if err := s.verify(frames[d+1], parts); err != nil {
		return nil, err
	}
	m := &message{Identities: frames[:d], RawHeader: parts[0], Parent: parts[1],
		Metadata: parts[2], Content: parts[3], Buffers: frames[d+6:]}
	if err := json.Unmarshal(parts[0], &m.Header); err != nil {
		return nil, fmt.Errorf("kernel: header is not a JSON object: %v", err)
	}
	if m.Header.MsgType == "" {
		return nil, errors.New("kernel: header has no msg_type; every request needs one")
	}
	if !json.Valid(parts[3]) || (len(parts[3]) > 0 && parts[3][0] != '{') {
		return nil, fmt.Errorf("kernel: content of %s is not a JSON object", m.Header.MsgType)
	}
	return m, nil
}

// encode builds the frames of a message with the given header, parent,
// metadata and content, signed by s.
func encode(ids [][]byte, h Header, parent json.RawMessage, content any, s *signer) ([][]byte, error) {
	hb, err := json.Marshal(h)
	if err != nil {
		return nil, err
	}
	cb, err := json.Marshal(content)
	if err != nil {
		return nil, fmt.Errorf("kernel: cannot encode %s content: %w", h.MsgType, err)
	}
	if len(parent) == 0 {
		parent = json.RawMessage("{}")
	}
	parts := [4][]byte{hb, parent, []byte("{}"), cb}
	frames := make([][]byte, 0, len(ids)+6)
	frames = append(frames, ids...)
	frames = append(frames, delimiter, s.sign(parts))
	return append(frames, parts[:]...), nil
}

// newHeader returns a fresh header of msgType for session and user.
func newHeader(msgType, session, user string) Header {
	return Header{
		MsgID:    uuid.NewString(),
		Session:  session,
		Username: user,
		Date:     time.Now().UTC().Format("2006-01-02T15:04:05.000000Z07:00"),
		MsgType:  msgType,
		Version:  ProtocolVersion,
	}
}
