"""Tiny psql wrapper for the external checks (no driver needed)."""
import os
import subprocess


def query(sql, db="striae_external"):
    """Run sql through psql in unaligned mode; return rows as lists of strings."""
    out = subprocess.run(
        ["psql", "-X", "-q", "-At", "-F", "\t", "-v", "ON_ERROR_STOP=1", "-d", db, "-c", sql],
        check=True, capture_output=True, text=True, env=dict(os.environ)).stdout
    return [line.split("\t") for line in out.splitlines() if line]


def fresh_db(db="striae_external"):
    """Drop and recreate the scratch database with the extension installed."""
    subprocess.run(["dropdb", "--if-exists", db], check=True)
    subprocess.run(["createdb", db], check=True)
    query("CREATE EXTENSION striae", db)


def nums(s):
    """'a/b/c' or '{a,b,c}' to floats."""
    return [float(x) for x in s.strip("{}").replace("/", ",").split(",")]
