# Reference for densitySegments(): R dbscan::hdbscan (Hahsler, Piekenbrock & Doran 2019) on open
# datasets: dbscan::moons and dbscan::DS3 (shipped with the dbscan package; DS3 every 8th row),
# datasets::faithful (Old Faithful eruptions, Härdle 1991; 16 duplicated rows, so zero distances
# occur) and datasets::quakes (Fiji earthquakes; the first 300 rows, lat/long/depth standardised
# with scale()). R's minPts sets both the core-distance neighbour count (the row itself counted:
# coredist is the distance to the (minPts - 1)-th other row) and the smallest cluster size, so
# each case maps to densitySegments({ minSize: minPts, minSamples: minPts }).
# "ties" is hand-made (14 rows): three identical rows and a unit square, a duplicated pair, four
# equally spaced rows on a line with one row beside them, and a lone row; every distance is
# repeated. It pins what identical rows do to the excess of mass (minPts 2 and 3) and the scores
# when every row is noise (minPts 6).
# Cluster 0 is R's noise. The "manhattan" case passes a dist object (our Dissimilarity path).
# Run: Rscript test/reference/hdbscan_dbscan.R   (Debian r-cran-dbscan)
suppressMessages(library(dbscan))
data("moons", package = "dbscan")
data("DS3", package = "dbscan")
num <- function(v) paste0("[", paste(sprintf("%.17g", v), collapse = ","), "]")
int <- function(v) paste0("[", paste(as.integer(v), collapse = ","), "]")
rowsJson <- function(x) paste0("[", paste(apply(x, 1, num), collapse = ","), "]")
ds3 <- as.matrix(DS3)[seq(1, nrow(DS3), by = 8), ]
quakes300 <- scale(as.matrix(datasets::quakes[1:300, c("lat", "long", "depth")]))
attributes(quakes300) <- list(dim = dim(quakes300))
ties <- matrix(c(0, 0, 0, 0, 0, 0, 1, 0, 0, 1, 1, 1, 5, 5, 5, 5, 10, 0, 11, 0, 12, 0, 13, 0, 6, 9, 11, 1),
  ncol = 2, byrow = TRUE)
sets <- list(
  list(name = "moons", x = as.matrix(moons), minPts = c(3, 5, 10), metric = "euclidean"),
  list(name = "moons", x = as.matrix(moons), minPts = c(5), metric = "manhattan"),
  list(name = "faithful", x = as.matrix(datasets::faithful), minPts = c(2, 4, 10, 25), metric = "euclidean"),
  list(name = "quakes300", x = quakes300, minPts = c(4, 8, 15), metric = "euclidean"),
  list(name = "DS3/8", x = ds3, minPts = c(10, 25), metric = "euclidean"),
  list(name = "ties", x = ties, minPts = c(2, 3, 6), metric = "euclidean")
)
cases <- c()
data <- c()
for (s in sets) {
  x <- unname(s$x)
  if (s$metric == "euclidean") data <- c(data, sprintf('"%s":%s', s$name, rowsJson(x)))
  for (m in s$minPts) {
    input <- if (s$metric == "euclidean") x else dist(x, method = s$metric)
    h <- hdbscan(input, minPts = m)
    cases <- c(cases, sprintf(
      '{"dataset":"%s","metric":"%s","minPts":%d,"call":"hdbscan(%s, minPts = %d)","cluster":%s,"outlierScores":%s,"coreDistances":%s,"membership":%s}',
      s$name, s$metric, m, if (s$metric == "euclidean") "x" else sprintf("dist(x, \\\"%s\\\")", s$metric), m,
      int(h$cluster), num(h$outlier_scores), num(h$coredist), num(h$membership_prob)))
  }
}
out <- sprintf('{"producedBy":"R %s, dbscan %s","source":"dbscan::moons, dbscan::DS3 (every 8th row), datasets::faithful, datasets::quakes (rows 1-300, lat/long/depth, scale()), ties (hand-made, 14 rows)","data":{%s},"cases":[%s]}',
  paste(R.version$major, R.version$minor, sep = "."), as.character(packageVersion("dbscan")), paste(data, collapse = ","), paste(cases, collapse = ","))
dir.create("fixtures", showWarnings = FALSE)
writeLines(out, "fixtures/hdbscan_dbscan.json")
