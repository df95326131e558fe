# vigil: build, run and test. `make run` opens the window, `make test` runs
# every check CI runs. Both install what is missing first (see `deps`).

GO      ?= go
BIN     := bin/vigil
# Debian/Ubuntu packages Fyne's cgo/OpenGL driver needs to build.
DEB_PKGS := gcc pkg-config libgl1-mesa-dev xorg-dev
# Extra packages for the screenshot script only.
SHOT_PKGS := xvfb imagemagick

.PHONY: all deps build run test vet unit layering bench fuzz refdata screenshots clean

all: build

# deps installs the C compiler and the GL/X11 headers when they are missing:
# with apt-get (through sudo when not root) on Debian and Ubuntu, otherwise it
# says exactly what to install.
deps:
	@command -v $(GO) >/dev/null || { echo "vigil needs Go 1.26 or later: https://go.dev/dl/"; exit 1; }
	@missing=""; \
	if command -v dpkg-query >/dev/null 2>&1; then \
	  for p in $(DEB_PKGS); do \
	    dpkg-query -W -f='$${Status}' $$p 2>/dev/null | grep -q "install ok installed" || missing="$$missing $$p"; \
	  done; \
	  if [ -n "$$missing" ]; then \
	    echo "installing:$$missing"; \
	    if [ "$$(id -u)" = 0 ]; then SUDO=""; else SUDO="sudo"; fi; \
	    $$SUDO apt-get update -qq && DEBIAN_FRONTEND=noninteractive $$SUDO apt-get install -y -qq $$missing >/dev/null || { \
	      echo "could not install:$$missing (run: sudo apt-get install$$missing)"; exit 1; }; \
	  fi; \
	else \
	  command -v gcc >/dev/null && { pkg-config --exists gl x11 xrandr xcursor xinerama xi xxf86vm 2>/dev/null; } || { \
	    echo "vigil's window needs a C compiler and the OpenGL and X11 development headers:"; \
	    echo "  Fedora: sudo dnf install gcc libXcursor-devel libXrandr-devel mesa-libGL-devel libXi-devel libXinerama-devel libXxf86vm-devel"; \
	    echo "  Arch:   sudo pacman -S gcc libxcursor libxrandr libxinerama libxi mesa"; \
	    echo "  macOS:  xcode-select --install"; \
	    exit 1; }; \
	fi

build: deps
	$(GO) build -o $(BIN) ./cmd/vigil

run: build
	./$(BIN)

test: deps vet layering unit

vet:
	$(GO) vet ./...

unit:
	$(GO) test ./...

# Nothing below app may import the GUI or plotting libraries.
layering:
	@deps=$$($(GO) list -deps example.org/vigil/ephem/... example.org/vigil/observe/... example.org/vigil/reduce/... example.org/vigil/internal/...) || exit 1; \
	bad=$$(echo "$$deps" | grep -E 'fyne\.io|gonum\.org/v1/plot' || true); \
	if [ -n "$$bad" ]; then echo "layering: ephem, observe, reduce and internal must not import:"; echo "$$bad"; exit 1; fi

bench: deps
	$(GO) test -run '^$$' -bench . -benchmem ./...

# A short fuzzing run of every fuzz target (seed corpora live in testdata/).
FUZZTIME ?= 20s
fuzz:
	@for pkg in $$($(GO) list ./...); do \
	  for f in $$($(GO) test -list '^Fuzz' $$pkg | grep '^Fuzz'); do \
	    echo "== $$pkg $$f"; $(GO) test -run '^$$' -fuzz "^$$f$$" -fuzztime $(FUZZTIME) $$pkg || exit 1; \
	  done; \
	done

# Regenerate every reference table from its script (needs Debian's
# python3-astropy and python3-numpy; runs offline). The scripts sit beside
# the tables they write, under testdata/.
refdata:
	@for s in $$(find . -path '*/testdata/*.py' -not -path './.git/*' | sort); do echo "== $$s"; /usr/bin/python3 $$s || exit 1; done

# Screenshots of every panel for the README (needs Xvfb and ImageMagick).
screenshots: build
	@./.ci/screenshots.sh

clean:
	rm -rf bin
