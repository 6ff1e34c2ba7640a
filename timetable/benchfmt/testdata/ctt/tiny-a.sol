alg big 0 0
alg small 0 1
geo small 0 2
his big 1 0
geo big 1 2
