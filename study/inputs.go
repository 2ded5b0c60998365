package study

import (
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"os"
)

// InputsSHA256 is the fingerprint of a study's input files, so that a
// report can be matched to the files that made it: the SHA-256 (FIPS 180-4)
// of the lines "<hex SHA-256 of the file>\n", one per file in the order
// given (the plant file, then the trend log it names). The same value
// comes out of a shell as
//
//	sha256sum plant.yaml trend.csv | cut -d' ' -f1 | sha256sum
//
// Only the contents count: renaming or moving a file keeps the value.
func InputsSHA256(paths ...string) (string, error) {
	all := sha256.New()
	for _, p := range paths {
		f, err := os.Open(p)
		if err != nil {
			return "", fmt.Errorf("study: fingerprint of the inputs: %w", err)
		}
		h := sha256.New()
		_, err = io.Copy(h, f)
		f.Close()
		if err != nil {
			return "", fmt.Errorf("study: fingerprint of the inputs: %w", err)
		}
		fmt.Fprintf(all, "%s\n", hex.EncodeToString(h.Sum(nil)))
	}
	return hex.EncodeToString(all.Sum(nil)), nil
}

// inputPaths are the files a study read: the plant file and, for a trend
// profile, the trend log.
func (in *Input) inputPaths() []string {
	paths := []string{in.Plant.Source}
	if in.Trend != nil {
		paths = append(paths, in.Trend.Name)
	}
	return paths
}
