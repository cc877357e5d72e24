# Reference for k-medoids (PAM: BUILD + SWAP) from R's cluster package (cluster::pam).
#  - Ruspini (1970) 75 points, as cluster ships it (data(ruspini)), Euclidean, k = 4 (and 2..6)
#  - the flower data of Struyf, Hubert & Rousseeuw (1997), as cluster ships it (data(flower)),
#    Gower dissimilarity by cluster::daisy, k = 3 and 4
#  - data of our own making with many tied dissimilarities (small integer grid, Manhattan)
# pam$objective is the AVERAGE dissimilarity to the medoid; the fixture also stores the total.
# Writes fixtures/pam_ruspini.json. Run: Rscript test/reference/pam_ruspini.R
library(cluster)
setwd(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))
num <- function(v) formatC(v, digits = 17, format = "g")
arr <- function(v) paste0("[", paste(trimws(num(v)), collapse = ","), "]")
ints <- function(v) paste0("[", paste(v, collapse = ","), "]")
fit_json <- function(fit, k, n) {
  paste0("{\"k\": ", k,
         ", \"medoidRows\": ", ints(fit$id.med),
         ", \"clustering\": ", ints(fit$clustering),
         ", \"objectiveBuild\": ", trimws(num(fit$objective[["build"]])),
         ", \"objectiveSwap\": ", trimws(num(fit$objective[["swap"]])),
         ", \"totalBuild\": ", trimws(num(fit$objective[["build"]] * n)),
         ", \"totalSwap\": ", trimws(num(fit$objective[["swap"]] * n)),
         ", \"averageSilhouette\": ", trimws(num(fit$silinfo$avg.width)), "}")
}

data(ruspini)
x <- as.matrix(ruspini)
ruspini_fits <- sapply(2:6, function(k) fit_json(pam(x, k), k, nrow(x)))
ruspini_rows <- paste0("[", apply(x, 1, function(r) paste(r, collapse = ",")), "]", collapse = ",")

data(flower)
g <- daisy(flower)
flower_fits <- sapply(3:4, function(k) fit_json(pam(g, k, diss = TRUE), k, attr(g, "Size")))

set.seed(20261202)
grid <- matrix(sample(0:3, 40 * 2, replace = TRUE), ncol = 2)
m <- dist(grid, method = "manhattan")
tie_fits <- sapply(2:5, function(k) fit_json(pam(m, k, diss = TRUE), k, attr(m, "Size")))

json <- paste0(
  "{\n\"producedBy\": \"R ", R.version$major, ".", R.version$minor, " cluster ", packageVersion("cluster"),
  " pam() (BUILD + SWAP); daisy() for Gower\",\n",
  "\"source\": \"Ruspini (1970) data and the flower data of Struyf, Hubert & Rousseeuw (1997), both as shipped by R package cluster; the grid case is data of our own making (set.seed(20261202))\",\n",
  "\"ruspini\": {\"rows\": [", ruspini_rows, "], \"fits\": [", paste(ruspini_fits, collapse = ",\n"), "]},\n",
  "\"flowerGower\": {\"condensed\": ", arr(as.vector(g)), ", \"fits\": [", paste(flower_fits, collapse = ",\n"), "]},\n",
  "\"tiedGrid\": {\"rows\": [", paste0("[", apply(grid, 1, paste, collapse = ","), "]", collapse = ","), "], \"metric\": \"manhattan\", \"condensed\": ", arr(as.vector(m)),
  ", \"fits\": [", paste(tie_fits, collapse = ",\n"), "]}\n}\n")
writeLines(json, "fixtures/pam_ruspini.json")
