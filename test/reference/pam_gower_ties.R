# Reference for the tie rule of k-medoids BUILD (and the SWAP that follows) from R's
# cluster::pam on Gower dissimilarities full of ties: data of our own making (set.seed below),
# binary, nominal and ordered columns with few levels plus one coarse numeric column, so many
# pairs share a dissimilarity and many BUILD gains tie exactly. pam(do.swap = FALSE) gives the
# BUILD medoids alone; pam() the medoids after SWAP.
# Writes fixtures/pam_gower_ties.json. Run: Rscript test/reference/pam_gower_ties.R
library(cluster)
setwd(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))
num <- function(v) formatC(v, digits = 17, format = "g")
arr <- function(v) paste0("[", paste(trimws(num(v)), collapse = ","), "]")
ints <- function(v) paste0("[", paste(v, collapse = ","), "]")

cases <- list()
for (seed in 1:12) {
  set.seed(20261203 + seed)
  n <- 30 + 5 * seed
  x <- data.frame(
    member = factor(sample(c("yes", "no"), n, replace = TRUE)),
    zone = factor(sample(c("north", "south", "east"), n, replace = TRUE)),
    band = factor(sample(c("low", "mid", "high"), n, replace = TRUE), levels = c("low", "mid", "high"), ordered = TRUE),
    trips = sample(0:4, n, replace = TRUE),
    tenure = sample(0:2, n, replace = TRUE) / 3,
    weekend = factor(sample(c("yes", "no"), n, replace = TRUE)),
    fare = factor(sample(c("full", "reduced", "student", "senior"), n, replace = TRUE))
  )
  # Five to seven columns: Gower averages over the columns, so most values are not binary fractions.
  x <- x[, 1:(4 + seed %% 4)]
  g <- daisy(x, metric = "gower")
  fits <- sapply(2:5, function(k) {
    built <- pam(g, k, diss = TRUE, do.swap = FALSE)
    swapped <- pam(g, k, diss = TRUE)
    paste0("{\"k\": ", k, ", \"buildMedoidRows\": ", ints(sort(built$id.med)),
           ", \"medoidRows\": ", ints(sort(swapped$id.med)),
           ", \"totalBuild\": ", trimws(num(swapped$objective[["build"]] * n)),
           ", \"totalSwap\": ", trimws(num(swapped$objective[["swap"]] * n)), "}")
  })
  cases[[seed]] <- paste0("{\"seed\": ", 20261203 + seed, ", \"n\": ", n, ", \"condensed\": ", arr(as.vector(g)),
                          ", \"fits\": [", paste(fits, collapse = ",\n"), "]}")
}

json <- paste0(
  "{\n\"producedBy\": \"R ", R.version$major, ".", R.version$minor, " cluster ", packageVersion("cluster"),
  " daisy(metric = 'gower') and pam(diss = TRUE) with and without SWAP\",\n",
  "\"source\": \"data of our own making (binary, nominal, ordered and coarse numeric columns, five to seven of them), seeds in each case\",\n",
  "\"cases\": [", paste(cases, collapse = ",\n"), "]\n}\n")
writeLines(json, "fixtures/pam_gower_ties.json")
