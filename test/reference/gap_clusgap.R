#!/usr/bin/env Rscript
# Reference values for the gap statistic and the silhouette from a dissimilarity (src/assess),
# from R's recommended package cluster (Debian r-base-core, r-cran-cluster).
#
# Writes fixtures/gap_clusgap.json:
#  - clusGap(x, FUNcluster = kmeans, K.max = 8, B = 100, nstart = 10, spaceH0 = "scaledPCA",
#    d.power = 2) on (a) four Gaussian blobs of our own making, (b) Ruspini's 75 points (1970),
#    (c) uniform noise of our own making; its Tab and maxSE(..., method = "Tibs2001SEmax").
#    d.power = 2 is Tibshirani, Walther & Hastie's (2001) definition (squared distances); the
#    clusGap default d.power = 1 is its older, unsquared variant.
#  - silhouette(pam(ruspini, 4)) on Euclidean distances: per-row widths, neighbours, average.
suppressPackageStartupMessages(library(cluster))

num <- function(v) paste0("[", paste(sprintf("%.17g", v), collapse = ","), "]")
int <- function(v) paste0("[", paste(as.integer(v), collapse = ","), "]")
rowsJson <- function(x) paste0("[", paste(apply(x, 1, num), collapse = ","), "]")
str <- function(s) paste0('"', gsub('"', '\\\\"', s), '"')

gapCase <- function(name, x, source) {
  set.seed(20261202)
  g <- clusGap(x, FUNcluster = kmeans, K.max = 8, B = 100, nstart = 10, iter.max = 50,
               spaceH0 = "scaledPCA", d.power = 2, verbose = FALSE)
  tab <- g$Tab
  rec <- maxSE(tab[, "gap"], tab[, "SE.sim"], method = "Tibs2001SEmax")
  paste0(str(name), ":{",
         '"source":', str(source), ",",
         '"rows":', rowsJson(x), ",",
         '"k":', int(seq_len(nrow(tab))), ",",
         '"logW":', num(tab[, "logW"]), ",",
         '"expectedLogW":', num(tab[, "E.logW"]), ",",
         '"gap":', num(tab[, "gap"]), ",",
         '"se":', num(tab[, "SE.sim"]), ",",
         '"recommended":', rec, "}")
}

# (a) of our own making: four well separated blobs in 2 dimensions, 50 rows each.
set.seed(7)
centres <- rbind(c(0, 0), c(6, 0), c(0, 6), c(6, 6))
blobs <- do.call(rbind, lapply(1:4, function(i) cbind(rnorm(50, centres[i, 1], 0.8), rnorm(50, centres[i, 2], 0.8))))
# (c) of our own making: uniform noise on the unit square, 150 rows (no structure).
set.seed(11)
noise <- cbind(runif(150), runif(150))

data(ruspini)
rusp <- as.matrix(ruspini)

p <- pam(ruspini, 4)
sil <- silhouette(p$clustering, dist(ruspini))

json <- paste0("{",
  '"producedBy":', str(paste0(R.version.string, ", package cluster ", packageVersion("cluster"))), ",",
  '"script":"test/reference/gap_clusgap.R",',
  '"source":{"ruspini":"Ruspini, E. H. (1970) Numerical methods for fuzzy clustering. Information Sciences 2, 319-350; as shipped by R package cluster (data(ruspini))",',
  '"own":"of our own making: set.seed(7) four Gaussian blobs (sd 0.8, 50 rows each) and set.seed(11) uniform noise, stored here"},',
  '"call":"clusGap(x, FUNcluster = kmeans, K.max = 8, B = 100, nstart = 10, iter.max = 50, spaceH0 = \\"scaledPCA\\", d.power = 2); maxSE(gap, SE.sim, method = \\"Tibs2001SEmax\\")",',
  '"gap":{',
  gapCase("blobs", blobs, "own"), ",",
  gapCase("ruspini", rusp, "ruspini"), ",",
  gapCase("noise", noise, "own"),
  "},",
  '"pamRuspini":{',
  '"call":"pam(ruspini, 4); silhouette(p$clustering, dist(ruspini))",',
  '"rows":', rowsJson(rusp), ",",
  '"clustering":', int(p$clustering), ",",
  '"widths":', num(sil[, "sil_width"]), ",",
  '"neighbour":', int(sil[, "neighbor"]), ",",
  '"average":', sprintf("%.17g", mean(sil[, "sil_width"])), ",",
  '"averageFromPam":', sprintf("%.17g", p$silinfo$avg.width),
  "}}")
out <- file.path(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))), "fixtures", "gap_clusgap.json")
writeLines(json, out)
cat("wrote", out, "\n")
