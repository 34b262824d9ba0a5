import type { Translations } from '../../translation'
import { finalSignoff } from './common-steps'

export const spindleTramCheck: Translations = {
  es: {
    title: 'Comprobar la escuadra del husillo',
    summary: 'Medir con un reloj comparador en un brazo giratorio cuánto está a escuadra el husillo con la mesa, y apuntar la inclinación de delante atrás y de lado a lado.',
    steps: {
      'why-tram': {
        title: 'Por qué importa la escuadra',
        body: 'Un husillo inclinado deja escalones entre las pasadas de planeado y corta paredes en pendiente. Esta comprobación mide la inclinación.',
        guidance: 'La inclinación en la dirección del paso lateral deja un pequeño escalón entre pasadas vecinas. La inclinación en la dirección del avance deja cada pasada hundida en el centro.',
        hazard: 'Un husillo fuera de escuadra deja crestas en las superficies planeadas y hace desigual cada ajuste de profundidad.',
        avoid: 'Comprueba la escuadra después de cualquier choque, después de mover el soporte del husillo y cada vez que toque según el taller.',
      },
      'spindle-isolated': {
        title: 'Corta la corriente del husillo antes de girarlo a mano',
        body: 'Vas a girar el husillo a mano con un brazo de reloj en la pinza. El husillo no debe poder arrancar.',
        guidance: 'El brazo giratorio sobresale mucho de la pinza. A velocidad giraría como una cuchilla.',
        hazard: 'Si el husillo arranca con el brazo giratorio puesto, el brazo da vueltas a toda velocidad. Puede herirte gravemente las manos o salir despedido.',
        avoid: 'Apaga el husillo en su mando y córtale la alimentación. Deja el programa cerrado. Gira el husillo solo a mano.',
      },
      'reference-surface': {
        title: 'Prepara una referencia plana',
        body: 'Pon una referencia plana debajo del husillo, como una zona de tabla recién planeada o una placa rectificada. Límpiala.',
        guidance: 'La comprobación es tan buena como la superficie bajo la punta del reloj. Polvo o una viruta bajo la punta aparecen como inclinación.',
      },
      'fit-sweep-arm': {
        title: 'Pon el reloj en un brazo giratorio',
        body: 'Pon el brazo giratorio en la pinza y sujeta el reloj comparador en él. Deja la punta a 75 mm del eje del husillo, para que barra un círculo de 150 mm.',
        guidance: 'Un círculo más grande muestra inclinaciones más pequeñas. Usa siempre el mismo círculo para poder comparar lecturas.',
      },
      'preload': {
        title: 'Baja Z para precargar el reloj',
        body: 'Baja Z hasta que la punta del reloj toque la referencia y la aguja se mueva como media vuelta. Pon el reloj a cero en la posición de delante.',
        guidance: 'Un poco de precarga mantiene la punta en contacto en toda la vuelta.',
      },
      'tram-front-back': {
        title: 'Lee de delante atrás',
        body: 'Gira el husillo a mano para que la punta vaya de delante atrás. Escribe la lectura de atrás menos la de delante.',
        guidance: 'El rango permitido es un punto de partida para un círculo de 150 mm (práctica habitual, sin fuente publicada). Usa la cifra del fabricante si el manual la da.',
        label: 'Atrás menos delante en 150 mm',
      },
      'tram-left-right': {
        title: 'Lee de izquierda a derecha',
        body: 'Gira el husillo para que la punta vaya del lado izquierdo al derecho. Escribe la lectura de la derecha menos la de la izquierda.',
        guidance: 'Gira el husillo siempre en el mismo sentido. Girar adelante y atrás puede hacer que la punta resbale.',
        label: 'Derecha menos izquierda en 150 mm',
      },
      'adjust': {
        title: 'Ajusta si una lectura está fuera de rango',
        body: 'Si una lectura está fuera de rango, ajusta el soporte del husillo como dice el manual del fabricante de la máquina. Vuelve a medir las dos direcciones y apunta las lecturas nuevas. Sáltate este paso si las dos lecturas están dentro de rango.',
        guidance: 'Ajustar una dirección a menudo mueve un poco la otra, así que vuelve a medir siempre las dos.',
      },
      'remove-sweep-arm': {
        title: 'Quita el brazo giratorio',
        body: 'Sube Z. Saca el reloj y el brazo giratorio de la pinza. Guárdalos en su caja.',
        guidance: 'Comprueba que no queda nada en la pinza antes de volver a encender el husillo.',
      },
      'final-signoff': finalSignoff('Las dos lecturas de escuadra están apuntadas, cualquier ajuste está vuelto a medir y el brazo giratorio está fuera del husillo.'),
    },
  },
}

/** Translations of each starter procedure's version 1, by slug. */
