alg big 0 2
alg big 1 0
geo small 1 2
geo small 1 1
his big 0 0
