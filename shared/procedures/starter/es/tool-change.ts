import type { Translations } from '../../translation'
import { spindleStopped, sharpEdges, finalSignoff } from './common-steps'

export const toolChange: Translations = {
  es: {
    title: 'Cambiar la pinza y la fresa',
    summary: 'Cambiar la fresa y, si hace falta, la pinza. Incluye parar el husillo, limpiar, la profundidad de inserción, el apriete y medir la herramienta nueva.',
    steps: {
      'spindle-stopped': spindleStopped,
      'sharp-edges': sharpEdges,
      'raise-and-park': {
        title: 'Sube Z y lleva el husillo a un sitio cómodo',
        body: 'Sube Z del todo. Lleva el husillo con el jog a la parte delantera de la mesa, donde llegues bien a la tuerca.',
        guidance: 'En una posición cómoda las manos van más firmes con las llaves.',
      },
      'remove-bit': {
        title: 'Quita la fresa vieja',
        body: 'Sujeta el husillo con una llave y afloja la tuerca con la otra. Coge la fresa cuando caiga. Quita la tuerca y la pinza.',
        guidance: 'Algunas pinzas necesitan una segunda vuelta después de que la tuerca se afloja para soltar la fresa.',
      },
      'clean-collet': {
        title: 'Limpia la pinza, la tuerca y el cono',
        body: 'Limpia la pinza, el interior de la tuerca y el cono del husillo. Busca grietas, rebabas y marcas de desgaste en la pinza.',
        guidance: 'La resina y el polvo fino se acumulan en las ranuras de la pinza. Una pinza sucia agarra de forma desigual y la fresa gira descentrada.',
      },
      'collet-notice': {
        title: 'Usa una pinza sana y de la medida justa',
        body: 'La pinza tiene que ser exactamente de la medida del vástago. Cambia una pinza agrietada, rayada o gastada.',
        guidance: 'Vástagos en pulgadas y en milímetros que parecen iguales no valen para la misma pinza.',
        hazard: 'Una pinza gastada, sucia o de otra medida deja que la fresa resbale y gire descentrada, y estropea el trabajo y la fresa.',
        avoid: 'Pon la pinza que corresponde a la medida del vástago. Cámbiala cuando esté gastada o dañada.',
      },
      'insertion-depth': {
        title: 'Mete bastante vástago en la pinza',
        body: 'Una fresa sujeta por poco vástago se puede salir o partir. Mete el vástago hasta donde pide el fabricante de la fresa.',
        guidance: 'No la metas tanto que los filos o el radio del vástago queden dentro de la pinza.',
        hazard: 'Una fresa agarrada por poco vástago se puede salir o romper y salir despedida del husillo a toda velocidad, hiriendo gravemente a alguien.',
        avoid: 'Encaja primero la pinza en la tuerca. Mete el vástago por lo menos tan hondo como pide el fabricante de la fresa. Deja los filos fuera de la pinza.',
      },
      'fit-bit': {
        title: 'Pon la fresa nueva',
        body: 'Encaja la pinza en la tuerca y enrosca la tuerca en el husillo a mano. Mete la fresa a la profundidad correcta. Aprieta con las dos llaves.',
        guidance: 'Aprieta firme pero sin echar todo tu peso. El fabricante del husillo o de la fresadora da el par correcto.',
      },
      'wrenches-off': {
        title: 'Quita las llaves del husillo',
        body: 'Una llave olvidada en la tuerca sale disparada en cuanto arranca el husillo. Deja ahora las dos llaves en su sitio.',
        guidance: 'Acostúmbrate a tener las llaves en la mano o en su soporte, nunca sobre la máquina.',
        hazard: 'Una llave olvidada en la tuerca de la pinza sale despedida a toda velocidad cuando arranca el husillo y puede herir gravemente a alguien.',
        avoid: 'Quita las dos llaves del husillo y déjalas en su soporte antes de volver a dar corriente al husillo.',
      },
      'measure-tool': {
        title: 'Mide la longitud de la herramienta nueva',
        body: 'Vuelve a dar corriente al husillo. Haz la medición de longitud de herramienta, o pon el cero de Z a mano si la máquina no tiene sensor.',
        guidance: 'Cada fresa queda a una altura distinta en la pinza, así que el cero de Z se pone otra vez después de cada cambio.',
      },
      'final-signoff': finalSignoff('La fresa nueva está puesta a la profundidad correcta en una pinza sana, las llaves están fuera del husillo y la longitud de la herramienta está medida.'),
    },
  },
}
