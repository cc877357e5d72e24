# Reference for k-means on Fisher's iris (1936) as R ships it (datasets::iris):
# R stats::kmeans (Hartigan–Wong) with many random starts, k = 2..6.
# Writes fixtures/kmeans_iris.json. Run: Rscript test/reference/kmeans_iris.R
setwd(dirname(sub("--file=", "", grep("--file=", commandArgs(FALSE), value = TRUE))))
x <- as.matrix(iris[, 1:4])
set.seed(20261202)
fit3 <- kmeans(x, 3, nstart = 100)
by_k <- lapply(2:6, function(k) {
  fit <- kmeans(x, k, nstart = 200, iter.max = 100)
  list(k = k, withinSS = fit$tot.withinss)
})
num <- function(v) formatC(v, digits = 17, format = "g")
rows <- paste0("[", apply(x, 1, function(r) paste(num(r), collapse = ",")), "]", collapse = ",")
json <- paste0(
  "{\n",
  "\"producedBy\": \"R ", R.version$major, ".", R.version$minor, " stats::kmeans (Hartigan-Wong)\",\n",
  "\"source\": \"Fisher (1936) iris data, as shipped by R datasets::iris (columns Sepal.Length, Sepal.Width, Petal.Length, Petal.Width)\",\n",
  "\"rows\": [", rows, "],\n",
  "\"k3\": {\"nstart\": 100, \"withinSS\": ", num(fit3$tot.withinss),
  ", \"betweenSS\": ", num(fit3$betweenss), ", \"totalSS\": ", num(fit3$totss),
  ", \"cluster\": [", paste(fit3$cluster, collapse = ","), "]",
  ", \"sizes\": [", paste(fit3$size, collapse = ","), "]},\n",
  "\"bestByK\": {\"nstart\": 200, \"table\": [",
  paste(sapply(by_k, function(e) paste0("{\"k\": ", e$k, ", \"withinSS\": ", num(e$withinSS), "}")), collapse = ","),
  "]}\n}\n")
writeLines(json, "fixtures/kmeans_iris.json")
