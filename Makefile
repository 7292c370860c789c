# striae: PostgreSQL extension (PGXS) in C++17 with Eigen.
#
#   make            build the extension
#   make install    install it into the PostgreSQL found by pg_config
#   make test       install dependencies if missing, build, unit tests, then
#                   pg_regress and external checks on a throwaway cluster
#   make demo       install dependencies if missing, build, run the demo
#   make bench      benchmarks (ratios against baselines measured in the same run)
#   make unit       GoogleTest unit tests of src/core only (no server)
#   make sanitize   the unit tests under AddressSanitizer and UndefinedBehaviorSanitizer
#   make fuzz       libFuzzer harnesses, FUZZ_SECONDS (default 300) per target
#   make mutation   mutation score of the tests (tests/mutation/mutants.txt)
#
# Two extensions are built and installed side by side: striae (C++, this
# library) and its companion striae_gis (SQL only, requires striae and PostGIS;
# its script is src/gis/), so that striae itself never needs PostGIS.

EXTENSION   = striae striae_gis
EXTVERSION  = 0.2.0
GIS_VERSION = 0.1.0
MODULE_big  = striae
PG_CONFIG  ?= pg_config

CORE_SRCS   = $(sort $(wildcard src/core/*.cpp))
GLUE_SRCS   = $(sort $(wildcard src/pg/*.cpp))
OBJS        = $(CORE_SRCS:.cpp=.o) $(GLUE_SRCS:.cpp=.o)
SQL_PARTS   = $(sort $(wildcard src/sql/*.sql))
# Released install scripts are frozen copies, never edited (src/sql/released/).
# The upgrade script from 0.1.0 is the hand-written part for objects that
# 0.1.0 already had (src/sql/upgrade/), followed by the fragments that are
# wholly new in 0.2.0 (listed here), so a new object is written once.
NEW_IN_0_2_0 = src/sql/50_figures.sql src/sql/50_usability.sql src/sql/55_index.sql src/sql/60_analysis.sql \
               src/sql/65_maps.sql src/sql/70_partial.sql
UPGRADE_0_2_0 = src/sql/upgrade/0.1.0--0.2.0.sql $(NEW_IN_0_2_0)
DATA        = src/sql/released/striae--0.1.0.sql src/gis/striae_gis--$(GIS_VERSION).sql
DATA_built  = striae--$(EXTVERSION).sql striae--0.1.0--$(EXTVERSION).sql
REGRESS     = $(basename $(notdir $(sort $(wildcard sql/*.sql))))
REGRESS_OPTS = --dbname=striae_regress

EIGEN_CFLAGS = -isystem /usr/include/eigen3
WARN         = -Wall -Wextra -Werror
# Server headers as system headers: their own warnings are not ours to fix.
PG_CPPFLAGS  = -isystem $(shell $(PG_CONFIG) --includedir-server 2>/dev/null)
# -fno-semantic-interposition and -Bsymbolic: calls inside striae.so go direct
# (and may inline) instead of through the PLT; nothing interposes our symbols.
PG_CXXFLAGS  = -std=c++17 $(EIGEN_CFLAGS) $(WARN) -Wno-missing-field-initializers -O2 -fno-semantic-interposition
SHLIB_LINK   = -lstdc++ -Wl,-Bsymbolic
# Debian's server is built with LLVM; its bitcode rule would compile our C++
# with clang in C++14 and without our flags. JIT inlining of striae is not needed.
override with_llvm = no

PGXS := $(shell $(PG_CONFIG) --pgxs 2>/dev/null)
ifneq ($(wildcard $(PGXS)),)
include $(PGXS)
else
all install installcheck:
	@echo "PostgreSQL server development files not found: run 'bash scripts/install-deps.sh' (or 'make test')" >&2
	@exit 1
endif

striae--$(EXTVERSION).sql: $(SQL_PARTS)
	cat $(SQL_PARTS) > $@

striae--0.1.0--$(EXTVERSION).sql: $(UPGRADE_0_2_0)
	cat $(UPGRADE_0_2_0) > $@

# Every object depends on the headers (small project: rebuild all on a change).
$(OBJS): $(wildcard src/core/*.hpp src/pg/*.hpp)

# ---- unit tests (no server) ------------------------------------------------
BUILD        = build
UNIT_SRCS    = $(sort $(wildcard tests/unit/*.cpp))
UNIT_BIN     = $(BUILD)/unit_tests
UNIT_CXXFLAGS = -std=c++17 $(EIGEN_CFLAGS) $(WARN) -O2 -g -Isrc/core

# One object per source, so that `make -j2 unit` uses both cores.
UNIT_OBJS    = $(patsubst %.cpp,$(BUILD)/unit/%.o,$(CORE_SRCS) $(UNIT_SRCS))

$(BUILD)/unit/%.o: %.cpp $(wildcard src/core/*.hpp tests/unit/*.hpp)
	@mkdir -p $(dir $@)
	g++ $(UNIT_CXXFLAGS) -c $< -o $@

$(UNIT_BIN): $(UNIT_OBJS)
	g++ $(UNIT_CXXFLAGS) $(UNIT_OBJS) -lgtest -lgtest_main -pthread -o $@

unit:
	$(MAKE) -j2 $(UNIT_BIN)
	./$(UNIT_BIN) --gtest_brief=1

# ---- sanitizers: the unit tests under ASan + UBSan (GCC) -----------------------
# Any report fails the run (-fno-sanitize-recover). Objects are compiled one by
# one so that `make -j2 sanitize` uses both cores.
SAN_DIR      = $(BUILD)/san
SAN_FLAGS    = -fsanitize=address,undefined -fno-sanitize-recover=all -fno-omit-frame-pointer
SAN_CXXFLAGS = -std=c++17 $(EIGEN_CFLAGS) $(WARN) -O1 -g $(SAN_FLAGS) -Isrc/core
SAN_OBJS     = $(patsubst %.cpp,$(SAN_DIR)/%.o,$(CORE_SRCS) $(UNIT_SRCS))
SAN_BIN      = $(SAN_DIR)/unit_tests

$(SAN_DIR)/%.o: %.cpp $(wildcard src/core/*.hpp tests/unit/*.hpp)
	@mkdir -p $(dir $@)
	g++ $(SAN_CXXFLAGS) -c $< -o $@

$(SAN_BIN): $(SAN_OBJS)
	g++ $(SAN_CXXFLAGS) $(SAN_OBJS) -lgtest -lgtest_main -pthread -o $@

# The two tests that bound wall time (Bootstrap.Speed*, Dihedra.AddSpeed) are
# left out: instrumented code runs 3 to 10 times slower.
sanitize: deps
	$(MAKE) -j2 $(SAN_BIN)
	ASAN_OPTIONS=detect_leaks=1:strict_string_checks=1:detect_stack_use_after_return=1 \
	  UBSAN_OPTIONS=print_stacktrace=1 ./$(SAN_BIN) --gtest_brief=1 --gtest_filter='-*Speed*'

# ---- fuzzing: libFuzzer harnesses of every reader in src/core (clang) ---------
# tests/fuzz/fuzz_<target>.cpp, seeds in tests/fuzz/corpus/<target>/, inputs
# of past findings in tests/fuzz/regress/<target>/. The core is built once with
# coverage, ASan and UBSan; each harness links against it.
FUZZ_CXX      ?= clang++-14
FUZZ_DIR       = $(BUILD)/fuzz
FUZZ_CXXFLAGS  = -std=c++17 $(EIGEN_CFLAGS) $(WARN) -O1 -g -fno-omit-frame-pointer \
                 -fsanitize=address,undefined -fno-sanitize-recover=all -Isrc/core
FUZZ_SRCS      = $(sort $(wildcard tests/fuzz/fuzz_*.cpp))
FUZZ_TARGETS   = $(notdir $(FUZZ_SRCS:.cpp=))
FUZZ_BINS      = $(addprefix $(FUZZ_DIR)/,$(FUZZ_TARGETS))
FUZZ_CORE_OBJS = $(patsubst src/core/%.cpp,$(FUZZ_DIR)/obj/%.o,$(CORE_SRCS))

$(FUZZ_CORE_OBJS): $(FUZZ_DIR)/obj/%.o: src/core/%.cpp $(wildcard src/core/*.hpp)
	@mkdir -p $(dir $@)
	$(FUZZ_CXX) $(FUZZ_CXXFLAGS) -fsanitize=fuzzer-no-link -c $< -o $@

$(FUZZ_BINS): $(FUZZ_DIR)/%: tests/fuzz/%.cpp $(FUZZ_CORE_OBJS) $(wildcard tests/fuzz/*.hpp)
	$(FUZZ_CXX) $(FUZZ_CXXFLAGS) -fsanitize=fuzzer $< $(FUZZ_CORE_OBJS) -o $@

fuzz-build: $(FUZZ_BINS)

# A few seconds per target (FUZZ_SMOKE_SECONDS, default 2): part of `make test`.
fuzz-smoke: deps
	$(MAKE) -j2 fuzz-build
	bash tests/fuzz/run.sh smoke $(FUZZ_TARGETS)

# The long run: FUZZ_SECONDS per target (default 300), corpus kept in build/fuzz/corpus.
fuzz: deps
	$(MAKE) -j2 fuzz-build
	bash tests/fuzz/run.sh long $(FUZZ_TARGETS)

# Regenerate the committed seed corpora (tests/fuzz/make_seeds.cpp).
fuzz-seeds:
	@mkdir -p $(BUILD)
	g++ $(UNIT_CXXFLAGS) $(CORE_SRCS) tests/fuzz/make_seeds.cpp -o $(BUILD)/make_seeds
	rm -rf tests/fuzz/corpus && ./$(BUILD)/make_seeds tests/fuzz/corpus

# ---- mutation score (not part of `make test`; minutes to an hour) ---------------
# Plants the mutants of tests/mutation/mutants.txt into a copy of the tree one at
# a time and runs the unit tests, then for the survivors the regression and
# external checks on one throwaway cluster (DEVELOPERS.md). MUTATE_ARGS passes
# options, e.g. MUTATE_ARGS='--only stress-tendency' or '--unit-only'.
mutation: deps
	/usr/bin/python3 scripts/mutate.py --cxxflags "$(UNIT_CXXFLAGS)" $(MUTATE_ARGS)

# ---- the commands of the README ---------------------------------------------
deps:
	bash scripts/install-deps.sh

# test, demo and bench install into the throwaway cluster's own directory
# (with-cluster.sh --install, Debian's extension_destdir), never into the system.
test: deps
	$(MAKE) -j2 all
	$(MAKE) unit
	$(MAKE) fuzz-smoke
	bash scripts/with-cluster.sh --install --clusters 3 $(MAKE) cluster-tests

# Runs inside a throwaway cluster (PGHOST, PGPORT, PGUSER set by with-cluster.sh).
cluster-tests:
	$(MAKE) installcheck || { cat regression.diffs 2>/dev/null | head -200; exit 1; }
	bash tests/external/run.sh

demo: deps
	$(MAKE) -j2 all
	bash scripts/with-cluster.sh --install bash demo/run.sh

bench: deps
	$(MAKE) -j2 all
	bash scripts/with-cluster.sh --install --clusters 3 bash bench/run.sh

clean: clean-striae
clean-striae:
	rm -rf $(BUILD) results regression.diffs regression.out demo-out

.PHONY: unit deps test cluster-tests demo bench clean-striae sanitize fuzz fuzz-build fuzz-smoke fuzz-seeds mutation
