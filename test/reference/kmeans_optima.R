# Reference for the quality of k-means optima: how often R's kmeans (Hartigan-Wong, its default)
# reaches the best known within-SS with 10 and with 200 random starts, on open datasets that R's
# datasets package ships, each scaled to mean 0 and standard deviation 1 by scale():
#   state.x77 (US state facts, 1977 Statistical Abstract), mtcars (Henderson & Velleman 1981),
#   swiss (Swiss fertility 1888), USJudgeRatings (lawyers' ratings of judges, 1977),
#   LifeCycleSavings (Belsley, Kuh & Welsch 1980), attitude (Chatterjee & Price 1977),
#   faithful (Old Faithful eruptions, Härdle 1991), quakes (Fiji earthquakes), rock (oil rock
#   samples), trees (black cherry trees, Ryan et al. 1976), stackloss (Brownlee 1960),
#   longley (Longley 1967).
# For each case (dataset, k = 2..8): the data, R's best within-SS over 1000 starts, and for the
# seeds 1..3 the within-SS R reaches with nstart = 10 and nstart = 200 (set.seed(seed) first).
# kmeans_optima.py adds scikit-learn's figures and writes fixtures/kmeans_optima.json.
# Run: Rscript test/reference/kmeans_optima.R && /usr/bin/python3 test/reference/kmeans_optima.py
setwd(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))
num <- function(v) trimws(formatC(v, digits = 17, format = "g"))
arr <- function(v) paste0("[", paste(num(v), collapse = ","), "]")
sets <- list(
  "state.x77" = state.x77, "mtcars" = mtcars, "swiss" = swiss, "USJudgeRatings" = USJudgeRatings,
  "LifeCycleSavings" = LifeCycleSavings, "attitude" = attitude, "faithful" = faithful,
  "quakes" = quakes, "rock" = rock, "trees" = trees, "stackloss" = stackloss, "longley" = longley
)
seeds <- 1:3
fit <- function(x, k, starts) kmeans(x, k, nstart = starts, iter.max = 100)$tot.withinss
cases <- character(0)
for (name in names(sets)) {
  x <- scale(as.matrix(sets[[name]]))
  rows <- paste0("[", apply(x, 1, function(r) paste(num(r), collapse = ",")), "]", collapse = ",")
  for (k in 2:8) {
    set.seed(20261203)
    best <- fit(x, k, 1000)
    r10 <- sapply(seeds, function(s) { set.seed(s); fit(x, k, 10) })
    r200 <- sapply(seeds, function(s) { set.seed(s); fit(x, k, 200) })
    cases <- c(cases, paste0("{\"dataset\": \"", name, "\", \"k\": ", k, ", \"rowsRef\": \"", name, "\"",
                             ", \"rBest1000\": ", num(best), ", \"r10\": ", arr(r10), ", \"r200\": ", arr(r200), "}"))
  }
  sets[[name]] <- rows
}
data_json <- paste0("\"", names(sets), "\": [", unlist(sets), "]", collapse = ",\n")
json <- paste0(
  "{\n\"producedBy\": \"R ", R.version$major, ".", R.version$minor, " stats::kmeans (algorithm Hartigan-Wong, iter.max = 100)\",\n",
  "\"source\": \"R datasets package, each column scaled by scale(); seeds 1..3 via set.seed\",\n",
  "\"data\": {", data_json, "},\n",
  "\"cases\": [", paste(cases, collapse = ",\n"), "]\n}\n")
writeLines(json, "fixtures/kmeans_optima_r.json")
