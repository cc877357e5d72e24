// Help texts of the command line.
export const MAIN_HELP = `kinsort — segments from a table of entities

Usage:
  kinsort fit DATA.csv --id COL --use A,B,C --method kmeans|kmedoids|hierarchy|mixture --k N --out DEF.json
  kinsort assign DEF.json DATA.csv [--out SCORED.csv] [--for spreadsheet|database]
  kinsort sql DEF.json --table NAME [--dialect duckdb|postgres|sqlite|clickhouse] [--id-column COL] [--out QUERY.sql]

Run "kinsort COMMAND --help" for the options of each command.
Errors print one line to standard error and exit with status 2. Text from the data echoed to
the terminal (ids, names, paths) has its control characters shown as escapes (\\n, \\e, …).
Each option may be given once; --out may not name a file the command reads.
`;

export const FIT_HELP = `kinsort fit DATA.csv --id COL --use A,B,C --method M --k N --out DEF.json [options]

Fit segments to a CSV table and write a segment definition (JSON). The same data, options and
seed always give a byte-identical file (no clock is read; put a date in --note if you want one).

Required:
  --id COL            column of unique row ids
  --use A,B,C         feature columns, comma-separated
  --method M          kmeans | kmedoids | hierarchy | mixture (Gaussian, by EM)
  --k N               number of segments
  --out DEF.json      where to write the definition

Options:
  --keep X,Y          profile-only columns (stored, never used to fit)
  --scale S           zscore (default) | robust | minmax | none
  --missing P         refuse (default) | drop | median
  --log A,B           numeric columns to pass through log1p before scaling
  --seed N            random seed (default 0; k-means, k-medoids and mixtures)
  --restarts N        k-means starts, the best kept (default 10); mixture starts (default 5)
  --covariance C      mixture: full (default) | diagonal | spherical | tied
  --linkage L         hierarchy: ward (default) | single | complete | average | weighted | centroid | median
  --metric D          euclidean (default) | manhattan | sqeuclidean — k-medoids and hierarchy
  --note TEXT         a note stored in the definition
  --silhouette S      sample (default): above 10,000 rows the summary silhouette is measured on a
                      seeded sample of 10,000 rows, as compareK does, and says so | full: all rows
                      (n² distances: minutes at 200,000 rows)

A hierarchy cut assigns new rows to the nearest segment mean in the prepared space; a mixture
to the component with the highest posterior probability.
Prints the segment sizes, the within-segment sum of squares (k-means, hierarchy) or the
total distance to the medoids (k-medoids), and the average silhouette.
`;

export const ASSIGN_HELP = `kinsort assign DEF.json DATA.csv [--out SCORED.csv] [--for spreadsheet|database]

Apply a definition to the rows of a CSV table: the stored preparation, then the nearest segment.
Writes a CSV with the id column, segment (1-based), distance and far (1 when farther than every
segment's 99th-percentile training distance); without --out it goes to standard output.
A row that cannot be prepared (a missing value under the stored policy, an unknown binary level,
text in a numeric column) keeps its line with empty segment, distance and far, and is named by id
on standard error. Extra columns are ignored (said once).

  --out SCORED.csv    write to a file instead of standard output (not the definition or data file)
  --for T             spreadsheet (default): an id a spreadsheet would run as a formula (starting
                      with = + - @, a tab or a carriage return, other than a plain number such as
                      -1.5) is written with a leading apostrophe, so it shows as text |
                      database: every id exactly as given, to load and join on the source table
`;

export const SQL_HELP = `kinsort sql DEF.json --table NAME [--dialect duckdb|postgres|sqlite|clickhouse] [--id-column COL] [--out QUERY.sql]

Write one SQL SELECT that scores every row of a table where the data lives: the stored text rule
(missing markers, ASCII-space trimming, the number grammar, exact level text), the stored
preparation and the nearest segment, giving the same segment as "kinsort assign" on the same
cells. Returns the id column, segment, distance and far. A row that assign refuses (a missing
value the stored policy does not fill, text in a numeric column, an unknown binary or ordinal
level) gets segment NULL. Read cells as text (for example DuckDB's read_csv(..., all_varchar =
true)): a value the database already converted (leading zeros dropped) cannot be recovered.

  --table NAME        table or view to score; schema.table is split at the dot and each part quoted;
                      quotes and control characters are refused
  --dialect NAME      duckdb (default), postgres, sqlite or clickhouse (18.16 and later: nested
                      SELECTs, no WITH)
  --id-column COL     id column, when it differs from the training table's
  --out QUERY.sql     write to a file instead of standard output
`;
