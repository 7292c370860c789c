# striae: PostgreSQL extension (PGXS) in C++17 with Eigen.
#
#   make            build the extension
#   make install    install it into the PostgreSQL found by pg_config
#   make test       install dependencies if missing, build, unit tests, then
#                   pg_regress and external checks on a throwaway cluster
#   make demo       install dependencies if missing, build, run the demo
#   make bench      benchmarks (ratios against baselines measured in the same run)
#   make unit       GoogleTest unit tests of src/core only (no server)

EXTENSION   = striae
EXTVERSION  = 0.2.0
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
NEW_IN_0_2_0 = src/sql/50_usability.sql src/sql/55_index.sql src/sql/60_analysis.sql
UPGRADE_0_2_0 = src/sql/upgrade/0.1.0--0.2.0.sql $(NEW_IN_0_2_0)
DATA        = src/sql/released/$(EXTENSION)--0.1.0.sql
DATA_built  = $(EXTENSION)--$(EXTVERSION).sql $(EXTENSION)--0.1.0--$(EXTVERSION).sql
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

$(EXTENSION)--$(EXTVERSION).sql: $(SQL_PARTS)
	cat $(SQL_PARTS) > $@

$(EXTENSION)--0.1.0--$(EXTVERSION).sql: $(UPGRADE_0_2_0)
	cat $(UPGRADE_0_2_0) > $@

# Every object depends on the headers (small project: rebuild all on a change).
$(OBJS): $(wildcard src/core/*.hpp src/pg/*.hpp)

# ---- unit tests (no server) ------------------------------------------------
BUILD        = build
UNIT_SRCS    = $(sort $(wildcard tests/unit/*.cpp))
UNIT_BIN     = $(BUILD)/unit_tests
UNIT_CXXFLAGS = -std=c++17 $(EIGEN_CFLAGS) $(WARN) -O2 -g -Isrc/core

$(UNIT_BIN): $(CORE_SRCS) $(UNIT_SRCS) $(wildcard src/core/*.hpp tests/unit/*.hpp)
	@mkdir -p $(BUILD)
	g++ $(UNIT_CXXFLAGS) $(CORE_SRCS) $(UNIT_SRCS) -lgtest -lgtest_main -pthread -o $@

unit: $(UNIT_BIN)
	./$(UNIT_BIN) --gtest_brief=1

# ---- the commands of the README ---------------------------------------------
deps:
	bash scripts/install-deps.sh

# test, demo and bench install into the throwaway cluster's own directory
# (with-cluster.sh --install, Debian's extension_destdir), never into the system.
test: deps
	$(MAKE) all
	$(MAKE) unit
	bash scripts/with-cluster.sh --install --clusters 3 $(MAKE) cluster-tests

# Runs inside a throwaway cluster (PGHOST, PGPORT, PGUSER set by with-cluster.sh).
cluster-tests:
	$(MAKE) installcheck || { cat regression.diffs 2>/dev/null | head -200; exit 1; }
	bash tests/external/run.sh

demo: deps
	$(MAKE) all
	bash scripts/with-cluster.sh --install bash demo/run.sh

bench: deps
	$(MAKE) all
	bash scripts/with-cluster.sh --install --clusters 3 bash bench/run.sh

clean: clean-striae
clean-striae:
	rm -rf $(BUILD) results regression.diffs regression.out demo-out

.PHONY: unit deps test cluster-tests demo bench clean-striae
