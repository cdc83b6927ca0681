package main

import (
	"bytes"
	"compress/gzip"
	"os"
	"path/filepath"
	"runtime"
	"sort"
	"sync"

	"github.com/andybalholm/brotli"
)

// gzipBytes compresses data with gzip at its best level. The header has no
// name and no time, so the output depends on data alone.
func gzipBytes(data []byte) ([]byte, error) {
	var b bytes.Buffer
	w, err := gzip.NewWriterLevel(&b, gzip.BestCompression)
	if err != nil {
		return nil, err
	}
	if _, err := w.Write(data); err != nil {
		return nil, err
	}
	if err := w.Close(); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// brotliBytes compresses data with brotli at quality 11.
func brotliBytes(data []byte) ([]byte, error) {
	var b bytes.Buffer
	w := brotli.NewWriterLevel(&b, brotli.BestCompression)
	if _, err := w.Write(data); err != nil {
		return nil, err
	}
	if err := w.Close(); err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// compressAll writes a .gz and a .br copy beside each file whose type is
// worth compressing, when the copy is smaller than the file, and returns
// the sizes of every file in names order. Files are compressed in
// parallel; the output does not depend on the scheduling.
func compressAll(dir string, names []string, files map[string][]byte) ([]FileStat, error) {
	stats := make([]FileStat, len(names))
	errs := make([]error, len(names))
	jobs := make(chan int)
	var wg sync.WaitGroup
	for range max(1, runtime.NumCPU()) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range jobs {
				stats[i], errs[i] = compressOne(dir, names[i], files[names[i]])
			}
		}()
	}
	// Largest first, so that the wasm's slow brotli pass overlaps the rest.
	order := make([]int, len(names))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool {
		return len(files[names[order[a]]]) > len(files[names[order[b]]])
	})
	for _, i := range order {
		jobs <- i
	}
	close(jobs)
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	return stats, nil
}

func compressOne(dir, name string, data []byte) (FileStat, error) {
	st := FileStat{Name: name, Raw: int64(len(data))}
	if !typeOf(name).compress {
		return st, nil
	}
	p := filepath.Join(dir, filepath.FromSlash(name))
	for _, c := range []struct {
		ext  string
		f    func([]byte) ([]byte, error)
		size *int64
	}{
		{".gz", gzipBytes, &st.Gzip},
		{".br", brotliBytes, &st.Brotli},
	} {
		z, err := c.f(data)
		if err != nil {
			return st, err
		}
		if len(z) >= len(data) {
			continue
		}
		if err := os.WriteFile(p+c.ext, z, 0o644); err != nil {
			return st, err
		}
		*c.size = int64(len(z))
	}
	return st, nil
}
